// The boundary between a computation and whoever asked for it (a command, a job of the window):
// an exception from a library (Boost.Math's domain and overflow errors, Eigen's allocation, the
// standard library's) becomes an Error with a message, never an abort. Used by the public entry
// points of core (computeRisk, computeSinglePositionRisk, runBacktest).
#pragma once

#include "tailwise/result.h"

#include <exception>
#include <new>
#include <string>

namespace tailwise {

template <class F>
auto catchLibraryErrors(F &&compute) -> decltype(compute())
{
    try {
        return compute();
    } catch (const std::bad_alloc &) {
        Error e;
        e.kind = ErrorKind::Numerical;
        e.message = "not enough memory for this computation (the input may be too large)";
        return e;
    } catch (const std::exception &failure) {
        Error e;
        e.kind = ErrorKind::Numerical;
        e.message = std::string("the computation could not be completed: ") + failure.what();
        return e;
    }
}

} // namespace tailwise
