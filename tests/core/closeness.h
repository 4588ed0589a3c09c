// Numeric comparisons for the tests that print the actual value, the expected value and the
// tolerance when they fail (QCOMPARE only knows exact or fuzzy-at-12-digits equality).
//
//   TW_CLOSE_ABS(actual, expected, tol)      |actual − expected| ≤ tol
//   TW_CLOSE_REL(actual, expected, rel)      |actual − expected| ≤ rel·|expected|
//   TW_CLOSE_PRINTED(actual, expected)       |actual − expected| ≤ half a unit in the last digit
//                                            of `expected` as written in the source (a table value)
// Each has a _CTX form taking a QString naming the case (loops over fixture cases).
// A non-finite actual value always fails.
#pragma once

#include <QString>
#include <QTest>

#include <cmath>
#include <cstdlib>
#include <cstring>

namespace tailwise::test {

inline bool checkClose(double actual, double expected, double tolerance, const char *expression,
                       const QString &context, const char *file, int line)
{
    const double diff = std::abs(actual - expected);
    if (std::isfinite(actual) && diff <= tolerance)
        return true;
    QString message = QStringLiteral("%1 is not close enough").arg(QString::fromUtf8(expression));
    if (!context.isEmpty())
        message += QStringLiteral(" [%1]").arg(context);
    message += QStringLiteral("\n   Actual   : %1\n   Expected : %2\n   Tolerance: %3 (difference %4)")
                   .arg(actual, 0, 'g', 17)
                   .arg(expected, 0, 'g', 17)
                   .arg(tolerance, 0, 'g', 3)
                   .arg(diff, 0, 'g', 3);
    QTest::qFail(message.toUtf8().constData(), file, line);
    return false;
}

// Half a unit in the last decimal place of a number written as text ("1.28155" → 5e-6), plus a
// few ulps so that a value exactly on the rounding boundary still passes.
inline double halfUnitInLastDigit(const char *literal)
{
    const char *point = std::strchr(literal, '.');
    int decimals = 0;
    if (point)
        for (const char *p = point + 1; *p >= '0' && *p <= '9'; ++p)
            ++decimals;
    const double value = std::abs(std::strtod(literal, nullptr));
    return 0.5 * std::pow(10.0, -decimals) + 4.0 * value * 2.220446049250313e-16;
}

} // namespace tailwise::test

#define TW_CLOSE_ABS_CTX(actual, expected, tol, context)                                                     \
    do {                                                                                                     \
        if (!::tailwise::test::checkClose((actual), (expected), (tol), #actual, (context), __FILE__, __LINE__)) \
            return;                                                                                          \
    } while (false)

#define TW_CLOSE_REL_CTX(actual, expected, rel, context)                                                     \
    do {                                                                                                     \
        const double twExpected_ = (expected);                                                               \
        if (!::tailwise::test::checkClose((actual), twExpected_, (rel) * std::abs(twExpected_), #actual,     \
                                          (context), __FILE__, __LINE__))                                    \
            return;                                                                                          \
    } while (false)

#define TW_CLOSE_ABS(actual, expected, tol) TW_CLOSE_ABS_CTX(actual, expected, tol, QString())
#define TW_CLOSE_REL(actual, expected, rel) TW_CLOSE_REL_CTX(actual, expected, rel, QString())
#define TW_CLOSE_PRINTED(actual, expected)                                                                   \
    TW_CLOSE_ABS(actual, expected, ::tailwise::test::halfUnitInLastDigit(#expected))
