// Bounds and rules for the free text a file or an option brings in: titles, asset and holding
// names, group names. Checked when a file is read (and when an option is given), so that a huge
// or hostile text is refused with a message naming the field and the place, never carried to a
// window, a page or a JSON file.
//   - at most maxTitleChars characters in a title, maxNameChars in an asset or holding name,
//     maxGroupNameChars in a group name (characters are Unicode code points);
//   - valid UTF-8 (RFC 3629: no overlong forms, no surrogates, nothing above U+10FFFF), so that
//     the JSON written from it is valid (RFC 8259 §8.1);
//   - no control characters (U+0000–U+001F, U+007F, U+0080–U+009F) except tab: they would pass to
//     a terminal (escape sequences) or break a line of a report.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace tailwise {

inline constexpr std::size_t maxTitleChars = 200;
inline constexpr std::size_t maxNameChars = 100;
inline constexpr std::size_t maxGroupNameChars = 200;

struct TextProblem {
    enum class Kind { InvalidUtf8, ControlCharacter, TooLong };
    Kind kind = Kind::InvalidUtf8;
    std::size_t byteOffset = 0;  // where the bad byte or character starts (InvalidUtf8, ControlCharacter)
    std::size_t characters = 0;  // the text's length in characters (TooLong)
    unsigned codePoint = 0;      // the control character (ControlCharacter)
};

// The first problem of `text` under the rules above, or nullopt when it is acceptable.
std::optional<TextProblem> checkText(std::string_view text, std::size_t maxChars);

// "the asset name is longer than 100 characters (found 1048576)", "the title has a byte that is
// not UTF-8 at character 12", "the name has a control character (U+001B) at character 3":
// `what` names the field ("the title", "the asset name").
std::string describeTextProblem(const TextProblem &problem, const std::string &what, std::size_t maxChars);

// Counts the code points of valid UTF-8 text (used for the column of a message).
std::size_t utf8Length(std::string_view text);

} // namespace tailwise
