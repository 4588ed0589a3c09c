// Calendar dates as a serial day number, parsed from and written as ISO 8601 (YYYY-MM-DD).
//
// The serial number counts days from 1970-01-01 in the proleptic Gregorian calendar
// (H. Hinnant's days_from_civil algorithm, public domain), so dates compare and subtract as ints.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace tailwise {

struct Date {
    int serial = 0; // days since 1970-01-01

    friend auto operator<=>(const Date &, const Date &) = default;
};

// Parses exactly "YYYY-MM-DD" with a valid month and day; anything else gives nullopt.
std::optional<Date> parseIsoDate(std::string_view text);
std::string toIso(Date date);
Date dateFromCivil(int year, int month, int day);

} // namespace tailwise
