#include "numbertext.h"

#include <cmath>
#include <cstdio>

namespace tailwise::cli {

std::string fixed(double value, int decimals)
{
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
    return buffer;
}

std::string money(double value, int decimals)
{
    std::string digits = fixed(std::abs(value), decimals);
    const std::size_t point = digits.find('.');
    std::string whole = digits.substr(0, point);
    const std::string rest = point == std::string::npos ? std::string() : digits.substr(point);
    std::string grouped;
    for (std::size_t i = 0; i < whole.size(); ++i) {
        if (i > 0 && (whole.size() - i) % 3 == 0)
            grouped += ',';
        grouped += whole[i];
    }
    const bool negative = value < 0 && fixed(std::abs(value), decimals).find_first_not_of("0.") != std::string::npos;
    return (negative ? "-" : "") + grouped + rest;
}

std::string percent(std::optional<double> fraction, int decimals)
{
    if (!fraction)
        return "n/a";
    return fixed(*fraction * 100.0, decimals) + "%";
}

} // namespace tailwise::cli
