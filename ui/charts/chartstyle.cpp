#include "charts/chartstyle.h"

#include "text/numbers.h"

#include <qcustomplot.h>

#include <QCoreApplication>
#include <QLocale>

#include <cmath>

namespace tailwise::ui::chartstyle {

// Palette and its luma (0.299 R + 0.587 G + 0.114 B), so greyscale prints keep them apart:
//   ink #26303a (45), slate #3d5a73 (80), rust #b0563e (111), teal #5f9ea0 (143),
//   ochre #d9a84e (174), sand #e9dcc0 (219), mist #e4e7ea (230).
QColor ink() { return QColor(0x26, 0x30, 0x3a); }
QColor slate() { return QColor(0x3d, 0x5a, 0x73); }
QColor teal() { return QColor(0x5f, 0x9e, 0xa0); }
QColor rust() { return QColor(0xb0, 0x56, 0x3e); }
QColor ochre() { return QColor(0xd9, 0xa8, 0x4e); }
QColor sand() { return QColor(0xe9, 0xdc, 0xc0); }
QColor mist() { return QColor(0xe4, 0xe7, 0xea); }

QColor seriesColor(int index)
{
    static const QColor colours[] = {QColor(0x26, 0x30, 0x3a), QColor(0x3d, 0x5a, 0x73), QColor(0x5f, 0x9e, 0xa0),
                                     QColor(0xb0, 0x56, 0x3e), QColor(0xc9, 0x93, 0x2e)};
    const int n = static_cast<int>(std::size(colours));
    return colours[((index % n) + n) % n];
}

Qt::PenStyle seriesPenStyle(int index)
{
    static const Qt::PenStyle styles[] = {Qt::SolidLine, Qt::DashLine, Qt::SolidLine, Qt::DashDotLine, Qt::DotLine};
    const int n = static_cast<int>(std::size(styles));
    return styles[((index % n) + n) % n];
}

QFont labelFont()
{
    QFont f;
    f.setPointSizeF(std::max(9.0, f.pointSizeF()));
    return f;
}

QFont tickFont()
{
    QFont f;
    f.setPointSizeF(std::max(8.5, f.pointSizeF() - 0.5));
    return f;
}

QFont noteFont()
{
    QFont f = labelFont();
    f.setItalic(true);
    return f;
}

void styleAxis(QCPAxis *axis)
{
    const QPen axisPen(ink(), 1);
    axis->setBasePen(axisPen);
    axis->setTickPen(axisPen);
    axis->setSubTickPen(axisPen);
    axis->setLabelColor(ink());
    axis->setTickLabelColor(ink());
    axis->setLabelFont(labelFont());
    axis->setTickLabelFont(tickFont());
    axis->grid()->setPen(QPen(mist(), 1));
    axis->grid()->setSubGridVisible(false);
    axis->grid()->setZeroLinePen(Qt::NoPen);
}

void stylePlot(QCustomPlot *plot)
{
    plot->setBackground(Qt::white);
    // QCustomPlot's default raster painting is kept (no setOpenGl): the charts draw the same
    // offscreen and under Xvfb.
    plot->setAntialiasedElements(QCP::aePlottables | QCP::aeItems);
    for (QCPAxisRect *rect : plot->axisRects())
        for (QCPAxis *axis : rect->axes())
            styleAxis(axis);
    plot->legend->setFont(labelFont());
    plot->legend->setTextColor(ink());
    plot->legend->setBorderPen(QPen(mist(), 1));
    plot->legend->setBrush(QColor(255, 255, 255, 230));
}

QString moneyUnit(const QString &currency)
{
    return currency.isEmpty() ? QCoreApplication::translate("chartstyle", "money") : currency;
}

QString money(double value, int decimals)
{
    return moneyText(value, decimals);
}

QString signedMoney(double value, int decimals)
{
    return signedMoneyText(value, decimals);
}

QString percent(double fraction, int decimals)
{
    return percentText(fraction, decimals);
}

QString confidenceText(double confidence)
{
    return tailwise::ui::confidenceText(confidence);
}

double niceStep(double span, int target)
{
    if (!(span > 0.0) || !std::isfinite(span) || target < 1)
        return 1.0;
    const double raw = span / target;
    const double power = std::pow(10.0, std::floor(std::log10(raw)));
    for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
        if (raw <= m * power * (1.0 + 1e-9))
            return m * power;
    return 10.0 * power;
}

} // namespace tailwise::ui::chartstyle
