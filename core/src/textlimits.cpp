#include "tailwise/textlimits.h"

#include <cstdio>

namespace tailwise {

namespace {

// Decodes one UTF-8 sequence at `i` (RFC 3629, Table 3-7 of The Unicode Standard: well-formed
// byte sequences). Returns its length, 0 when ill-formed.
std::size_t decode(std::string_view s, std::size_t i, unsigned &cp)
{
    const auto b = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
    const unsigned char c = b(0);
    if (c < 0x80) {
        cp = c;
        return 1;
    }
    const std::size_t left = s.size() - i;
    auto cont = [&](std::size_t k) { return k < left && (b(k) & 0xC0) == 0x80; };
    if (c >= 0xC2 && c <= 0xDF) {
        if (!cont(1))
            return 0;
        cp = ((c & 0x1Fu) << 6) | (b(1) & 0x3Fu);
        return 2;
    }
    if (c >= 0xE0 && c <= 0xEF) {
        if (!cont(1) || !cont(2))
            return 0;
        if ((c == 0xE0 && b(1) < 0xA0) || (c == 0xED && b(1) > 0x9F)) // overlong; surrogates
            return 0;
        cp = ((c & 0x0Fu) << 12) | ((b(1) & 0x3Fu) << 6) | (b(2) & 0x3Fu);
        return 3;
    }
    if (c >= 0xF0 && c <= 0xF4) {
        if (!cont(1) || !cont(2) || !cont(3))
            return 0;
        if ((c == 0xF0 && b(1) < 0x90) || (c == 0xF4 && b(1) > 0x8F)) // overlong; above U+10FFFF
            return 0;
        cp = ((c & 0x07u) << 18) | ((b(1) & 0x3Fu) << 12) | ((b(2) & 0x3Fu) << 6) | (b(3) & 0x3Fu);
        return 4;
    }
    return 0;
}

} // namespace

std::optional<TextProblem> checkText(std::string_view text, std::size_t maxChars)
{
    std::size_t chars = 0;
    std::optional<TextProblem> tooLong;
    for (std::size_t i = 0; i < text.size();) {
        unsigned cp = 0;
        const std::size_t n = decode(text, i, cp);
        if (n == 0)
            return TextProblem{TextProblem::Kind::InvalidUtf8, i, chars, 0};
        if ((cp < 0x20 && cp != '\t') || cp == 0x7F || (cp >= 0x80 && cp <= 0x9F))
            return TextProblem{TextProblem::Kind::ControlCharacter, i, chars, cp};
        ++chars;
        i += n;
    }
    if (chars > maxChars)
        return TextProblem{TextProblem::Kind::TooLong, 0, chars, 0};
    return std::nullopt;
}

std::size_t utf8Length(std::string_view text)
{
    std::size_t chars = 0;
    for (const char c : text)
        chars += (static_cast<unsigned char>(c) & 0xC0) != 0x80;
    return chars;
}

std::string describeTextProblem(const TextProblem &p, const std::string &what, std::size_t maxChars)
{
    switch (p.kind) {
    case TextProblem::Kind::TooLong:
        return what + " is longer than " + std::to_string(maxChars) + " characters (found " + std::to_string(p.characters)
               + ")";
    case TextProblem::Kind::InvalidUtf8:
        return what + " is not valid UTF-8 text (a bad byte after " + std::to_string(p.characters)
               + " characters); save the file as UTF-8";
    case TextProblem::Kind::ControlCharacter: {
        char code[16];
        std::snprintf(code, sizeof code, "U+%04X", p.codePoint);
        return what + " has a control character (" + code + ") after " + std::to_string(p.characters)
               + " characters; only printable text and tabs are accepted";
    }
    }
    return what + " is not acceptable";
}

} // namespace tailwise
