// Reading option values on the command line: whole numbers and finite decimals, and the usage
// error that names the option. Shared by every command's option parser.
#pragma once

#include "tailwise/result.h"

#include <optional>
#include <string>

namespace tailwise::cli {

// An Error about `option` (exit 2 in main.cpp): "--option: what".
Error usage(const std::string &option, const std::string &what);
// The whole text as a finite decimal (a leading '+' allowed); nullopt otherwise.
std::optional<double> toDouble(const std::string &text);
// The whole text as an int; nullopt otherwise (or when it does not fit).
std::optional<int> toInt(const std::string &text);

} // namespace tailwise::cli
