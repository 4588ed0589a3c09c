// Axis tick labels in the user's locale (thousands separators, decimal mark), which QCustomPlot's
// own tickers omit: it formats numbers with group separators switched off.
#pragma once

#include <qcustomplot.h>

namespace tailwise::ui {

class LocaleTicker : public QCPAxisTicker {
public:
    // suffix is appended to each label (e.g. "%"); scale multiplies the tick before printing.
    explicit LocaleTicker(QString suffix = {}, double scale = 1.0) : m_suffix(std::move(suffix)), m_scale(scale) {}

protected:
    double getTickStep(const QCPRange &range) override;
    QString getTickLabel(double tick, const QLocale &locale, QChar formatChar, int precision) override;

private:
    QString m_suffix;
    double m_scale;
    double m_step = 1.0; // of the last generated ticks, for the number of decimals
};

} // namespace tailwise::ui
