// The command line's exit status and its one way of reporting a failure, shared by every command.
// 0 success, 1 bad input data (the message names the file and place), 2 bad usage (the option).
#pragma once

#include <cstdio>
#include <string>

namespace tailwise::cli {

inline constexpr int exitOk = 0;
inline constexpr int exitBadInput = 1;
inline constexpr int exitUsage = 2;

// Prints "tailwise-cli: message" on stderr and returns `code`, for `return fail(…)`.
inline int fail(int code, const std::string &message)
{
    std::fprintf(stderr, "tailwise-cli: %s\n", message.c_str());
    return code;
}

} // namespace tailwise::cli
