// Result<T>: a value or an Error the user can be shown.
//
// Errors a user can cause (a bad file, a bad assumption, too little data) travel as values, never
// as exceptions or crashes. An Error carries a kind, the place it refers to (file, line, column or
// the name of a field/option) and a complete sentence saying what was expected. Programmer errors
// (violated preconditions inside the library) are assertions instead.
#pragma once

#include <cassert>
#include <string>
#include <utility>
#include <variant>
#include <vector>

namespace tailwise {

enum class ErrorKind {
    FileUnreadable,   // missing, a directory, permission denied, too large
    Format,           // malformed content: the place names line and column
    Value,            // a number that is not acceptable (non-finite, non-positive price, …)
    Reference,        // an asset that the price history does not have, a duplicate
    Assumption,       // an assumption outside its domain (confidence, horizon, window, λ, …)
    InsufficientData, // fewer returns than the computation needs
    Numerical,        // a computation that cannot give a defined figure
    Cancelled,        // a long computation stopped on request
};

struct Error {
    ErrorKind kind = ErrorKind::Format;
    std::string message; // the full sentence shown to the user, place included
    std::string file;    // empty when not about a file
    int line = 0;        // 1-based; 0 when not about a line
    int column = 0;      // 1-based; 0 when not about a column
    std::string field;   // option or field name, when the error is about one
};

// Builders that put the place at the front of the message in one consistent form:
//   "prices.csv, line 12, column 3: expected a number, found \"abc\""
Error fileError(ErrorKind kind, const std::string &file, int line, int column, const std::string &what);
Error fieldError(ErrorKind kind, const std::string &field, const std::string &what);

// A warning is advice that travels with a result: the figure is defined but the user should know.
using Warnings = std::vector<std::string>;

template <class T>
class [[nodiscard]] Result {
public:
    Result(T value) : m_state(std::move(value)) {}
    Result(Error error) : m_state(std::move(error)) {}

    bool ok() const { return std::holds_alternative<T>(m_state); }
    explicit operator bool() const { return ok(); }

    const T &value() const & { assert(ok()); return std::get<T>(m_state); }
    T &value() & { assert(ok()); return std::get<T>(m_state); }
    T &&value() && { assert(ok()); return std::get<T>(std::move(m_state)); }
    const Error &error() const { assert(!ok()); return std::get<Error>(m_state); }

private:
    std::variant<T, Error> m_state;
};

// For operations that return nothing on success.
struct Done {};
using Status = Result<Done>;

} // namespace tailwise
