#include "text/backtestwords.h"

#include "text/numbers.h"

#include <QCoreApplication>
#include <QLocale>

#include <cmath>

namespace tailwise::ui::backtestwords {

namespace {
// The texts keep the view's translation context.
QString tr(const char *text) { return QCoreApplication::translate("tailwise::ui::BacktestView", text); }
} // namespace

// A p-value as read in reports: four decimals, or "< 0.0001" below that.
QString pValueText(double p)
{
    if (!std::isfinite(p))
        return QStringLiteral("–");
    if (p < 0.0001)
        return QStringLiteral("< ") + QLocale().toString(0.0001, 'f', 4);
    return QLocale().toString(p, 'f', 4);
}

// A test size as a percentage without trailing zeros (0.05 → "5 %").
QString sizeText(double testSize)
{
    return confidenceText(testSize); // the same rule as every probability level
}

QString zoneName(Zone zone)
{
    switch (zone) {
    case Zone::Green: return tr("Green");
    case Zone::Yellow: return tr("Yellow");
    case Zone::Red: return tr("Red");
    }
    return {};
}

QString zoneMeaning(Zone zone)
{
    switch (zone) {
    case Zone::Green: return tr("within what chance gives a correct model");
    case Zone::Yellow: return tr("more than a correct model usually gives; look closer");
    case Zone::Red: return tr("so many that a correct model is very unlikely");
    }
    return {};
}

QString kupiecWords(const BacktestResult &r, const BacktestVerdict &v)
{
    if (!v.kupiecRejected)
        return tr("not rejected: the number of exceptions fits %1 VaR")
            .arg(confidenceText(r.assumptions.confidence));
    return v.tooManyExceptions ? tr("rejected: too many exceptions, the model understates the risk")
                               : tr("rejected: too few exceptions, the model overstates the risk");
}

QString independenceWords(const BacktestResult &r, const BacktestVerdict &v)
{
    if (r.christoffersen.transitions.total() == 0)
        return tr("not informative: no day-to-day transitions");
    if (!v.independenceRejected)
        return tr("not rejected: no sign that exceptions cluster in time");
    return v.clustering ? tr("rejected: an exception makes one the next day more likely")
                        : tr("rejected: exceptions are spread more evenly than chance gives");
}

QString coverageWords(const BacktestVerdict &v)
{
    return v.coverageRejected ? tr("rejected: rate and timing of exceptions together do not fit")
                              : tr("not rejected: rate and timing of exceptions together fit");
}

QString caution()
{
    return tr("A backtest looks at the past only, with today's holdings kept fixed: passing it does not "
              "prove the model right, and VaR is not the worst case. Estimates, not advice; regulatory "
              "use follows local rules and approved models.");
}

} // namespace tailwise::ui::backtestwords
