#include "text/numbers.h"

#include <QCoreApplication>
#include <QDate>
#include <QLocale>

#include <cmath>

namespace tailwise::ui {

namespace {
const QString dash = QStringLiteral("\u2014");
}

QString moneyText(double value, int decimals)
{
    if (!std::isfinite(value))
        return dash;
    if (std::abs(value) < 0.5 * std::pow(10.0, -decimals))
        value = 0.0; // what rounds to zero is written "0", never "-0"
    return QLocale().toString(value, 'f', decimals);
}

QString signedMoneyText(double value, int decimals)
{
    const QString text = moneyText(value, decimals);
    return std::isfinite(value) && std::abs(value) >= 0.5 * std::pow(10.0, -decimals) && value > 0.0
               ? QLocale().positiveSign() + text
               : text;
}

QString confidenceText(double level)
{
    if (!std::isfinite(level))
        return dash;
    // 'g' with enough digits drops trailing zeros (99.9, 97.5, 95) and the float noise of 1 − 0.99.
    return QLocale().toString(level * 100.0, 'g', 6) + QLocale().percent();
}

QString percentText(std::optional<double> fraction, int decimals)
{
    if (!fraction || !std::isfinite(*fraction))
        return dash;
    const QLocale locale;
    return locale.toString(*fraction * 100.0, 'f', decimals) + locale.percent();
}

QString numberText(double value, int maxDecimals)
{
    if (!std::isfinite(value))
        return dash;
    QString text = QLocale().toString(value, 'f', maxDecimals);
    const QString point = QLocale().decimalPoint();
    if (text.contains(point)) {
        while (text.endsWith(QLatin1Char('0')))
            text.chop(1);
        if (text.endsWith(point))
            text.chop(point.size());
    }
    return text;
}

QString quantityText(double value)
{
    return numberText(value, 6);
}

QString dateText(Date date)
{
    const QDate d = QDate(1970, 1, 1).addDays(date.serial);
    // Day and month name rather than the short numeric form, which reads differently by region.
    return QLocale().toString(d, QStringLiteral("d MMM yyyy"));
}

QString countText(int n, const QString &one, const QString &many)
{
    return n == 1 ? one : many.arg(QLocale().toString(n));
}

QString tradingDaysText(int days)
{
    return countText(days, QCoreApplication::translate("LocalNumbers", "1 trading day"),
                     QCoreApplication::translate("LocalNumbers", "%1 trading days"));
}

std::optional<double> readNumber(const QString &text)
{
    const QString t = text.trimmed();
    if (t.isEmpty())
        return std::nullopt;
    bool ok = false;
    double v = QLocale().toDouble(t, &ok);
    if (!ok)
        v = QLocale::c().toDouble(t, &ok);
    if (!ok || !std::isfinite(v))
        return std::nullopt;
    return v;
}

} // namespace tailwise::ui
