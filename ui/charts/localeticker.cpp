#include "charts/localeticker.h"

#include <QLocale>

#include <cmath>

namespace tailwise::ui {

double LocaleTicker::getTickStep(const QCPRange &range)
{
    m_step = QCPAxisTicker::getTickStep(range);
    return m_step;
}

QString LocaleTicker::getTickLabel(double tick, const QLocale &, QChar, int)
{
    const double v = tick * m_scale;
    if (!std::isfinite(v))
        return {};
    // As many decimals as the step needs: 2.5 → 1, 0.25 → 2, 1000 → 0.
    const double step = std::abs(m_step * m_scale);
    int decimals = 0;
    if (step > 0.0 && std::isfinite(step)) {
        for (; decimals < 6; ++decimals) {
            const double shifted = step * std::pow(10.0, decimals);
            if (std::abs(shifted - std::round(shifted)) < 1e-6 * shifted)
                break;
        }
    }
    return QLocale().toString(std::abs(v) < 1e-9 * step ? 0.0 : v, 'f', decimals) + m_suffix;
}

} // namespace tailwise::ui
