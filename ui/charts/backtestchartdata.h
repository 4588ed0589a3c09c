// The numbers behind the backtest chart, built from a core BacktestResult without drawing anything.
//
// One point per tested day t (backtest.h): the realised P&L_t (money, gains positive) and the
// line at −VaR_t (the forecast loss drawn below zero, so a day whose P&L falls under the line
// lost more than its VaR). Exceptions are the days core marked (−P&L_t > VaR_t); the builder
// copies core's flags and never decides one itself. Dates become the x axis as seconds since
// 1970-01-01 00:00 UTC (QCPAxisTickerDateTime's keys); the y range covers every P&L and every
// −VaR with a margin. Nothing non-finite ever reaches the data: a day with a non-finite figure
// (core refuses those, so this is only a guard) is left out and counted in `skippedDays`.
#pragma once

#include "tailwise/backtest.h"
#include "tailwise/date.h"

#include <QString>
#include <QVector>

namespace tailwise::ui {

struct BacktestChartData {
    QVector<double> keys;      // each tested day, seconds since the epoch (UTC midnight)
    QVector<double> pnl;       // realised P&L, money
    QVector<double> negVar;    // −VaR forecast, money (negative for a positive VaR)
    QVector<double> exceptionKeys, exceptionPnl; // the exceptions' days and P&L
    QVector<int> exceptionDays; // index of each exception in keys
    int skippedDays = 0;

    double xMin = 0.0, xMax = 1.0; // keys, with half a day either side
    double yMin = -1.0, yMax = 1.0;

    QString pnlLegend, varLegend, exceptionLegend, yLabel, note;
};

// `modelName` is the model as the window names it (e.g. "Normal"), for the legend; `currency` the
// workbook's code for the P&L axis (empty: "money").
BacktestChartData buildBacktestChartData(const tailwise::BacktestResult &result, const QString &modelName = {},
                                         const QString &currency = {});

// The key of a date: seconds since 1970-01-01 00:00 UTC.
double backtestDateKey(tailwise::Date date);

} // namespace tailwise::ui
