#include "optiontext.h"

#include <charconv>
#include <cmath>

namespace tailwise::cli {

Error usage(const std::string &option, const std::string &what)
{
    return fieldError(ErrorKind::Assumption, option, what);
}

std::optional<double> toDouble(const std::string &text)
{
    double v = 0.0;
    const char *begin = text.data();
    if (!text.empty() && text[0] == '+')
        ++begin;
    const auto [end, ec] = std::from_chars(begin, text.data() + text.size(), v);
    if (ec != std::errc() || end != text.data() + text.size() || !std::isfinite(v))
        return std::nullopt;
    return v;
}

std::optional<int> toInt(const std::string &text)
{
    int v = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (ec != std::errc() || end != text.data() + text.size())
        return std::nullopt;
    return v;
}

} // namespace tailwise::cli
