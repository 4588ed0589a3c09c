#include "tailwise/json.h"

#include <cassert>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace tailwise {

std::string jsonEscape(std::string_view text)
{
    std::string out;
    out.reserve(text.size() + 2);
    for (char ch : text) {
        const unsigned char c = static_cast<unsigned char>(ch);
        switch (c) {
        case '"': out += "\\\""; break;
        case '\\': out += "\\\\"; break;
        case '\n': out += "\\n"; break;
        case '\r': out += "\\r"; break;
        case '\t': out += "\\t"; break;
        default:
            if (c < 0x20) {
                char buffer[8];
                std::snprintf(buffer, sizeof buffer, "\\u%04x", c);
                out += buffer;
            } else {
                out += ch;
            }
        }
    }
    return out;
}

std::string formatShortest(double number)
{
    char buffer[64];
    const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, number);
    return std::string(buffer, end);
}

void JsonWriter::newline()
{
    if (m_indent <= 0)
        return;
    m_out += '\n';
    m_out.append(static_cast<std::size_t>(m_depth * m_indent), ' ');
}

void JsonWriter::beforeValue()
{
    if (m_afterKey) {
        m_afterKey = false;
        return;
    }
    if (m_depth > 0) {
        if (!m_first)
            m_out += ',';
        newline();
    }
    m_first = false;
}

JsonWriter &JsonWriter::beginObject()
{
    beforeValue();
    m_out += '{';
    ++m_depth;
    m_first = true;
    return *this;
}

JsonWriter &JsonWriter::endObject()
{
    --m_depth;
    if (!m_first)
        newline();
    m_out += '}';
    m_first = false;
    return *this;
}

JsonWriter &JsonWriter::beginArray()
{
    beforeValue();
    m_out += '[';
    ++m_depth;
    m_first = true;
    return *this;
}

JsonWriter &JsonWriter::endArray()
{
    --m_depth;
    if (!m_first)
        newline();
    m_out += ']';
    m_first = false;
    return *this;
}

JsonWriter &JsonWriter::key(std::string_view name)
{
    beforeValue();
    m_out += '"';
    m_out += jsonEscape(name);
    m_out += m_indent > 0 ? "\": " : "\":";
    m_afterKey = true;
    return *this;
}

JsonWriter &JsonWriter::value(double number)
{
    assert(std::isfinite(number) && "a non-finite number reached the JSON writer");
    beforeValue();
    m_out += std::isfinite(number) ? formatShortest(number) : std::string("null");
    return *this;
}

JsonWriter &JsonWriter::value(std::optional<double> number)
{
    return number ? value(*number) : null();
}

JsonWriter &JsonWriter::value(int number)
{
    beforeValue();
    m_out += std::to_string(number);
    return *this;
}

JsonWriter &JsonWriter::value(bool flag)
{
    beforeValue();
    m_out += flag ? "true" : "false";
    return *this;
}

JsonWriter &JsonWriter::value(std::string_view text)
{
    beforeValue();
    m_out += '"';
    m_out += jsonEscape(text);
    m_out += '"';
    return *this;
}

JsonWriter &JsonWriter::null()
{
    beforeValue();
    m_out += "null";
    return *this;
}

} // namespace tailwise
