#include "tailwise/result.h"

namespace tailwise {

Error fileError(ErrorKind kind, const std::string &file, int line, int column, const std::string &what)
{
    std::string place = file.empty() ? std::string("input") : file;
    if (line > 0)
        place += ", line " + std::to_string(line);
    if (column > 0)
        place += ", column " + std::to_string(column);
    Error error;
    error.kind = kind;
    error.message = place + ": " + what;
    error.file = file;
    error.line = line;
    error.column = column;
    return error;
}

Error fieldError(ErrorKind kind, const std::string &field, const std::string &what)
{
    Error error;
    error.kind = kind;
    error.message = field + ": " + what;
    error.field = field;
    return error;
}

} // namespace tailwise
