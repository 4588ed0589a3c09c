#include "charts/contributionschart.h"

#include "charts/chartstyle.h"
#include "charts/localeticker.h"

#include <qcustomplot.h>

#include <QFontMetricsF>
#include <QVBoxLayout>

#include <algorithm>

#include <cmath>

namespace tailwise::ui {

namespace {

QCPTextElement *title(QCustomPlot *plot, const QString &text)
{
    auto *t = new QCPTextElement(plot, text);
    QFont f = chartstyle::labelFont();
    f.setBold(true);
    t->setFont(f);
    t->setTextColor(chartstyle::ink());
    return t;
}

QCPItemText *valueText(QCustomPlot *plot, QCPAxisRect *rect, const QString &text, Qt::Alignment align)
{
    auto *t = new QCPItemText(plot);
    t->setClipAxisRect(rect);
    t->position->setAxes(rect->axis(QCPAxis::atBottom), rect->axis(QCPAxis::atLeft));
    t->setText(text);
    t->setFont(chartstyle::tickFont());
    t->setColor(chartstyle::ink());
    t->setPositionAlignment(align);
    t->setPadding(QMargins(4, 0, 4, 0));
    return t;
}

QString barText(const ContributionBar &bar)
{
    QString text = chartstyle::money(bar.componentVar);
    if (bar.share)
        text += QStringLiteral(" (") + chartstyle::percent(*bar.share, 0) + QStringLiteral(")");
    return text;
}

} // namespace

ContributionsChart::ContributionsChart(QWidget *parent) : QWidget(parent)
{
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    m_plot = new QCustomPlot(this);
    layout->addWidget(m_plot);
    build();
    // The bars' labels must fit inside the plot, which only the laid-out width in pixels tells:
    // on screen at every resize, on paper at the print size and fonts.
    connect(m_plot, &QCustomPlot::afterLayout, this, &ContributionsChart::fitLabelsInside);
    setData(ContributionsChartData{});
}

void ContributionsChart::build()
{
    QCustomPlot *p = m_plot;
    m_barsRect = p->axisRect();
    m_stepRect = new QCPAxisRect(p);
    p->plotLayout()->addElement(0, 1, m_stepRect);
    p->plotLayout()->insertRow(0);
    p->plotLayout()->addElement(0, 0, title(p, tr("Contribution of each holding to VaR")));
    p->plotLayout()->addElement(0, 1, title(p, tr("Diversification")));
    p->plotLayout()->setColumnStretchFactors({2.0, 1.0});
    chartstyle::stylePlot(p);

    // Bars run horizontally: holdings on the vertical (key) axis, money on the horizontal.
    QCPAxis *names = m_barsRect->axis(QCPAxis::atLeft);
    QCPAxis *money = m_barsRect->axis(QCPAxis::atBottom);
    m_barsRect->axis(QCPAxis::atTop)->setVisible(false);
    m_barsRect->axis(QCPAxis::atRight)->setVisible(false);
    money->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    names->grid()->setVisible(false);
    names->setTickLength(0, 0);
    names->setSubTicks(false);
    money->grid()->setZeroLinePen(QPen(chartstyle::ink(), 1));

    m_adders = new QCPBars(names, money);
    m_adders->setName(tr("Adds to VaR"));
    m_adders->setBrush(chartstyle::slate());
    m_adders->setPen(QPen(chartstyle::slate().darker(130), 1));
    m_adders->setWidth(0.7);
    m_hedges = new QCPBars(names, money);
    m_hedges->setName(tr("Hedge (lowers VaR)"));
    // Light and hatched: apart from the dark risk bars in colour, in greyscale and in print.
    m_hedges->setBrush(QBrush(chartstyle::ochre()));
    m_hedges->setPen(QPen(chartstyle::ochre().darker(150), 1.2));
    m_hedges->setWidth(0.7);

    p->legend->setVisible(true);
    p->legend->setFont(chartstyle::tickFont());
    m_barsRect->insetLayout()->addElement(p->legend, Qt::AlignBottom | Qt::AlignRight);

    QCPAxis *stepKeys = m_stepRect->axis(QCPAxis::atBottom);
    QCPAxis *stepMoney = m_stepRect->axis(QCPAxis::atLeft);
    m_stepRect->axis(QCPAxis::atTop)->setVisible(false);
    m_stepRect->axis(QCPAxis::atRight)->setVisible(false);
    QSharedPointer<QCPAxisTickerText> stepTicker(new QCPAxisTickerText);
    stepTicker->addTick(1, tr("Sum of\nstandalone"));
    stepTicker->addTick(2, tr("Benefit"));
    stepTicker->addTick(3, tr("Portfolio\nVaR"));
    stepKeys->setTicker(stepTicker);
    stepKeys->setRange(0.4, 3.6);
    stepKeys->grid()->setVisible(false);
    stepKeys->setTickLength(0, 0);
    stepKeys->setSubTicks(false);
    stepMoney->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    stepMoney->setLabel(tr("VaR (money)"));
    m_stepBars = new QCPBars(stepKeys, stepMoney);
    m_stepBars->setWidth(0.62);
    m_stepBars->setBrush(chartstyle::slate());
    m_stepBars->setPen(QPen(chartstyle::slate().darker(130), 1));
    m_stepBars->removeFromLegend();
    for (QCPAxis *axis : m_stepRect->axes())
        chartstyle::styleAxis(axis);
    for (QCPAxis *axis : m_barsRect->axes())
        chartstyle::styleAxis(axis);
    names->grid()->setVisible(false);
    stepKeys->grid()->setVisible(false);
}

void ContributionsChart::setData(const ContributionsChartData &data)
{
    m_data = data;
    m_plot->clearItems();
    m_barLabels.clear();
    m_stepLabels.clear();
    fillBars();
    fillDiversification();
    m_plot->replot(QCustomPlot::rpQueuedReplot);
}

void ContributionsChart::fillBars()
{
    QCPAxis *names = m_barsRect->axis(QCPAxis::atLeft);
    QCPAxis *money = m_barsRect->axis(QCPAxis::atBottom);
    const int n = static_cast<int>(m_data.bars.size());
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    QVector<double> addKeys, addValues, hedgeKeys, hedgeValues;
    double lo = 0.0, hi = 0.0;
    for (int i = 0; i < n; ++i) {
        const ContributionBar &bar = m_data.bars[static_cast<std::size_t>(i)];
        const double key = n - i; // the largest risk at the top
        ticker->addTick(key, bar.asset);
        (bar.hedge ? hedgeKeys : addKeys).push_back(key);
        (bar.hedge ? hedgeValues : addValues).push_back(bar.componentVar);
        lo = std::min(lo, bar.componentVar);
        hi = std::max(hi, bar.componentVar);
    }
    names->setTicker(ticker);
    names->setRange(0.4, n + 0.6);
    m_adders->setData(addKeys, addValues, true);
    m_hedges->setData(hedgeKeys, hedgeValues, true);
    m_hedges->setVisible(true);

    // Room on both sides for the value labels (fitLabelsInside makes it exact once laid out).
    const double span = std::max(hi - lo, 1.0);
    money->setRange(lo - (lo < 0.0 ? 0.45 * span : 0.02 * span), hi + 0.4 * span);
    money->setLabel(m_data.valueLabel);
    for (int i = 0; i < n; ++i) {
        const ContributionBar &bar = m_data.bars[static_cast<std::size_t>(i)];
        QCPItemText *t = valueText(m_plot, m_barsRect, barText(bar),
                                   (bar.hedge ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignVCenter);
        t->position->setCoords(bar.componentVar, n - i);
        m_barLabels.push_back(t);
    }
}

void ContributionsChart::fitLabelsInside()
{
    // The step's figures stay over their bars, moved in only as far as the frame needs.
    const QRectF stepArea = m_stepRect->rect();
    for (auto &[t, key] : m_stepLabels) {
        if (!t || !m_stepRect->visible())
            continue;
        t->position->setCoords(key, t->position->value());
        const double half = 0.5 * (QFontMetricsF(t->font()).horizontalAdvance(t->text()) + t->padding().left() + t->padding().right());
        const QPointF at = t->position->pixelPosition();
        const double x = std::clamp(at.x(), stepArea.left() + half, std::max(stepArea.left() + half, stepArea.right() - half));
        if (x != at.x())
            t->position->setPixelPosition(QPointF(x, at.y()));
    }
    QCPAxis *money = m_barsRect->axis(QCPAxis::atBottom);
    const double width = m_barsRect->width();
    if (m_barLabels.empty() || width < 20.0)
        return;
    std::erase_if(m_barLabels, [](const QPointer<QCPItemText> &t) { return t.isNull(); });
    double barsLo = 0.0, barsHi = 0.0;
    for (const QCPItemText *t : std::as_const(m_barLabels)) {
        barsLo = std::min(barsLo, t->position->key());
        barsHi = std::max(barsHi, t->position->key());
    }
    // Each label needs its own pixels beyond its bar's end: right of a risk bar, left of a hedge.
    // The money per pixel depends on the range being chosen, so a few rounds find a range whose
    // labels all fit (the fixed point exists while the labels together are narrower than the plot).
    double lo = barsLo, hi = barsHi;
    for (int round = 0; round < 12; ++round) {
        const double perPixel = std::max(hi - lo, 1.0) / width;
        double newLo = barsLo, newHi = barsHi;
        for (const QCPItemText *t : std::as_const(m_barLabels)) {
            const QMargins pad = t->padding();
            const double pixels = QFontMetricsF(t->font()).horizontalAdvance(t->text()) + pad.left() + pad.right() + 4.0;
            if (t->positionAlignment() & Qt::AlignRight)
                newLo = std::min(newLo, t->position->key() - pixels * perPixel);
            else
                newHi = std::max(newHi, t->position->key() + pixels * perPixel);
        }
        // Never more than ten times the bars' span: labels that cannot fit are cut, not the bars lost.
        const double span = std::max(barsHi - barsLo, 1.0);
        lo = std::max(newLo, barsLo - 5.0 * span);
        hi = std::min(newHi, barsHi + 5.0 * span);
    }
    const double margin = 0.02 * (hi - lo);
    const QCPRange fitted(lo - (barsLo < 0.0 || lo < barsLo ? margin : 0.0), hi + margin);
    if (std::abs(fitted.lower - money->range().lower) < 1e-9 * (1.0 + std::abs(fitted.lower))
        && std::abs(fitted.upper - money->range().upper) < 1e-9 * (1.0 + std::abs(fitted.upper)))
        return;
    money->setRange(fitted);
    // No more numbers along the axis than its width holds at its font.
    const QString widest = chartstyle::money(-std::max(std::abs(fitted.lower), std::abs(fitted.upper)));
    const double tickWidth = QFontMetricsF(money->tickLabelFont()).horizontalAdvance(widest);
    money->ticker()->setTickCount(std::clamp(static_cast<int>(width / (1.5 * std::max(tickWidth, 1.0))), 2, 6));
    // The ticks were made for the old range: lay out once more (as QCustomPlot's own layout
    // step does; the width of the plot does not depend on the money range).
    m_plot->plotLayout()->update(QCPLayoutElement::upPreparation);
    m_plot->plotLayout()->update(QCPLayoutElement::upMargins);
    m_plot->plotLayout()->update(QCPLayoutElement::upLayout);
}

void ContributionsChart::fillDiversification()
{
    QCPAxis *keys = m_stepRect->axis(QCPAxis::atBottom);
    QCPAxis *money = m_stepRect->axis(QCPAxis::atLeft);
    if (!m_data.stepLabel.isEmpty())
        money->setLabel(m_data.stepLabel); // names the workbook's currency when it has one
    const double whole = m_data.undiversifiedVar;
    const double var = m_data.portfolioVar;
    m_stepBars->setData(QVector<double>{1.0, 3.0}, QVector<double>{whole, var}, true);
    const double top = std::max({whole, var, 1.0});
    const double bottom = std::min({0.0, whole, var});
    money->setRange(bottom, top * 1.32); // room above for the note

    // The benefit as a floating step from the standalone sum down to the portfolio VaR.
    auto *step = new QCPItemRect(m_plot);
    step->setClipAxisRect(m_stepRect);
    step->topLeft->setAxes(keys, money);
    step->bottomRight->setAxes(keys, money);
    step->topLeft->setCoords(2.0 - 0.31, std::max(whole, var));
    step->bottomRight->setCoords(2.0 + 0.31, std::min(whole, var));
    step->setPen(QPen(chartstyle::teal().darker(140), 1, Qt::DashLine));
    step->setBrush(QBrush(chartstyle::teal().lighter(150), Qt::Dense4Pattern));

    QCPItemText *wholeText = valueText(m_plot, m_stepRect, chartstyle::money(whole), Qt::AlignHCenter | Qt::AlignBottom);
    wholeText->position->setCoords(1.0, whole);
    m_stepLabels.emplace_back(wholeText, 1.0);
    QCPItemText *varText = valueText(m_plot, m_stepRect, chartstyle::money(var), Qt::AlignHCenter | Qt::AlignBottom);
    varText->position->setCoords(3.0, var);
    m_stepLabels.emplace_back(varText, 3.0);
    // The benefit's figure sits inside its step, clear of the bars' own labels.
    // On a white ground: on a narrow panel the figure is wider than the step, and its dashed edges
    // would run through the digits.
    QCPItemText *benefit = valueText(m_plot, m_stepRect, QLocale().negativeSign() + chartstyle::money(m_data.diversificationBenefit),
                                     Qt::AlignCenter);
    benefit->position->setCoords(2.0, 0.5 * (whole + var));
    benefit->setBrush(QColor(255, 255, 255, 235));
    benefit->setPen(QPen(chartstyle::teal().darker(140), 1));
    m_stepLabels.emplace_back(benefit, 2.0);
    QCPItemText *note = valueText(m_plot, m_stepRect, m_data.benefitText, Qt::AlignHCenter | Qt::AlignTop);
    note->position->setTypeY(QCPItemPosition::ptAxisRectRatio);
    note->position->setCoords(2.0, 0.01);
    note->setFont(chartstyle::noteFont());
    m_benefitNote = note;
}

QCPItemText *ContributionsChart::benefitNote() const
{
    return m_benefitNote.data();
}

} // namespace tailwise::ui
