// A small JSON writer for reports (no Qt in core). Numbers are written in the shortest decimal
// form that reads back to the same double; a non-finite number is a programmer error (asserted)
// and is written as null so that no NaN ever reaches a file.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace tailwise {

class JsonWriter {
public:
    explicit JsonWriter(int indent = 2) : m_indent(indent) {}

    JsonWriter &beginObject();
    JsonWriter &endObject();
    JsonWriter &beginArray();
    JsonWriter &endArray();
    JsonWriter &key(std::string_view name);
    JsonWriter &value(double number);
    JsonWriter &value(std::optional<double> number); // null when empty
    JsonWriter &value(int number);
    JsonWriter &value(bool flag);
    JsonWriter &value(std::string_view text);
    JsonWriter &value(const char *text) { return value(std::string_view(text)); }
    JsonWriter &null();

    const std::string &text() const { return m_out; }

private:
    void beforeValue();
    void newline();
    std::string m_out;
    int m_indent;
    int m_depth = 0;
    bool m_first = true;
    bool m_afterKey = false;
};

std::string jsonEscape(std::string_view text);
// Shortest round-trip decimal text of a finite double.
std::string formatShortest(double number);

} // namespace tailwise
