// Checks that a reader's error names the right file, line and column, in the message the user
// sees as well as in the Error's fields (result.h: "file, line L, column C: what").
#pragma once

#include "tailwise/result.h"

#include <QString>
#include <QTest>

#include <string>

namespace tailwise::test {

struct ExpectedPlace {
    ErrorKind kind;
    std::string file;
    int line = 0;   // 0: not about a line
    int column = 0; // 0: not about a column
    std::string says; // a phrase the message must contain
};

inline std::string placePrefix(const ExpectedPlace &p)
{
    std::string s = p.file;
    if (p.line > 0)
        s += ", line " + std::to_string(p.line);
    if (p.column > 0)
        s += ", column " + std::to_string(p.column);
    return s + ": ";
}

template <class T>
bool checkErrorPlace(const Result<T> &result, const ExpectedPlace &expected, const char *file, int line)
{
    if (result.ok()) {
        QTest::qFail(qPrintable(QStringLiteral("expected an error \"%1…%2\", but the input was accepted")
                                    .arg(QString::fromStdString(placePrefix(expected)), QString::fromStdString(expected.says))),
                     file, line);
        return false;
    }
    const Error &e = result.error();
    const std::string prefix = placePrefix(expected);
    const bool ok = e.kind == expected.kind && e.file == expected.file && e.line == expected.line
        && e.column == expected.column && e.message.rfind(prefix, 0) == 0
        && e.message.find(expected.says) != std::string::npos;
    if (ok)
        return true;
    const QString message = QStringLiteral("wrong error\n   Actual   : kind %1, file \"%2\", line %3, column %4: \"%5\"\n"
                                           "   Expected : kind %6, message starting \"%7\" and containing \"%8\"")
                                .arg(int(e.kind))
                                .arg(QString::fromStdString(e.file))
                                .arg(e.line)
                                .arg(e.column)
                                .arg(QString::fromStdString(e.message))
                                .arg(int(expected.kind))
                                .arg(QString::fromStdString(prefix), QString::fromStdString(expected.says));
    QTest::qFail(qPrintable(message), file, line);
    return false;
}

} // namespace tailwise::test

#define TW_EXPECT_ERROR(result, ...)                                                                           \
    do {                                                                                                     \
        if (!::tailwise::test::checkErrorPlace((result), ::tailwise::test::ExpectedPlace{__VA_ARGS__}, __FILE__, \
                                               __LINE__))                                                    \
            return;                                                                                          \
    } while (false)
