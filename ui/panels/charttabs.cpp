#include "charttabs.h"

#include "charts/contributionschart.h"
#include "charts/losstailchart.h"
#include "charts/tradeoffchart.h"
#include "document/commands.h"
#include "document/workbook.h"
#include "localnumbers.h"

#include <QCheckBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLocale>
#include <QStackedWidget>
#include <QTabWidget>
#include <QVBoxLayout>

namespace tailwise::ui {

ChartTabs::ChartTabs(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    m_tabs = new QTabWidget(this);
    m_tabs->setObjectName(QStringLiteral("chartTabs"));
    m_tabs->setDocumentMode(true);

    auto *tailPage = new QWidget(m_tabs);
    m_lossTail = new LossTailChart(tailPage);
    m_percent = new QCheckBox(tr("Show as % of portfolio value"), tailPage);
    m_percent->setToolTip(tr("Draw the P&L axis as a share of the portfolio's value instead of money."));
    m_history = new QCheckBox(tr("Show the window's daily P&&L, scaled to the horizon"), tailPage);
    m_history->setChecked(true);
    m_history->setToolTip(tr("Bars: today's holdings applied to each day of the window, scaled by the square root "
                             "of the horizon — the data the model was fitted to."));
    auto *tailOptions = new QHBoxLayout;
    tailOptions->addWidget(m_percent);
    tailOptions->addWidget(m_history);
    tailOptions->addStretch();
    auto *tailLayout = new QVBoxLayout(tailPage);
    tailLayout->setContentsMargins(0, 4, 0, 0);
    tailLayout->addWidget(m_lossTail, 1);
    tailLayout->addLayout(tailOptions);
    m_tabs->addTab(tailPage, tr("Loss tail"));
    m_tabs->setTabToolTip(0, tr("How likely each horizon P&L is under the model; the shaded part is beyond VaR."));

    m_tradeoff = new TradeoffChart(m_tabs);
    m_tabs->addTab(m_tradeoff, tr("Horizon and confidence"));
    m_tabs->setTabToolTip(1, tr("How VaR grows with the horizon and the confidence. Click the map to use that setting."));

    m_contributions = new ContributionsChart(m_tabs);
    m_tabs->addTab(m_contributions, tr("What drives it"));
    m_tabs->setTabToolTip(2, tr("Each holding's part of VaR; hedges lower it. Also what diversification saves."));

    m_empty = new QLabel(this);
    m_empty->setAlignment(Qt::AlignCenter);
    m_empty->setWordWrap(true);
    m_empty->setText(tr("The charts appear here once there are figures to draw."));

    m_stack = new QStackedWidget(this);
    m_stack->addWidget(m_empty);
    m_stack->addWidget(m_tabs);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_stack);

    connect(&workbook, &Workbook::resultsChanged, this, &ChartTabs::refresh);
    connect(&workbook, &Workbook::contentsReset, this, &ChartTabs::refresh);
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::refreshTab);
    connect(m_percent, &QCheckBox::toggled, this, &ChartTabs::refreshLossTail);
    connect(m_history, &QCheckBox::toggled, this, &ChartTabs::refreshLossTail);
    connect(m_tradeoff, &TradeoffChart::assumptionsPicked, this, [this](int horizonDays, double confidence) {
        Assumptions a = m_workbook.assumptions();
        if (a.horizonDays == horizonDays && a.confidence == confidence)
            return;
        a.horizonDays = horizonDays;
        a.confidence = confidence;
        edit::setAssumptions(m_workbook, a,
                             tr("Pick %1 at %2 % on the map").arg(tradingDaysText(horizonDays), QLocale().toString(confidence * 100.0, 'g', 4)));
    });
    refresh();
}

void ChartTabs::refreshLossTail()
{
    const auto &report = m_workbook.report();
    if (!report)
        return;
    LossTailOptions options;
    options.unit = m_percent->isChecked() ? LossTailUnit::PercentOfValue : LossTailUnit::Money;
    options.showHistory = m_history->isChecked();
    m_lossTail->setData(buildLossTailChartData(*report, options));
}

void ChartTabs::refresh()
{
    const auto &report = m_workbook.report();
    if (!report) {
        const auto &error = m_workbook.resultError();
        const bool nothingYet = !m_workbook.hasPrices() || m_workbook.holdings().empty();
        m_empty->setText(error && !nothingYet ? tr("No charts: %1.").arg(QString::fromStdString(error->message))
                                              : tr("The charts appear here once there are figures to draw."));
        m_stack->setCurrentWidget(m_empty);
        return;
    }
    m_stack->setCurrentWidget(m_tabs);
    // Only the tab on view is redrawn now; the others when they are shown. With hundreds of
    // holdings a redraw of all three would cost more than a frame after every edit.
    m_stale = {true, true, true};
    refreshTab(m_tabs->currentIndex());
}

void ChartTabs::refreshTab(int tab)
{
    const auto &report = m_workbook.report();
    if (!report || tab < 0 || tab >= static_cast<int>(m_stale.size()) || !m_stale[static_cast<std::size_t>(tab)])
        return;
    m_stale[static_cast<std::size_t>(tab)] = false;
    if (tab == 0)
        refreshLossTail();
    else if (tab == 1)
        m_tradeoff->setData(buildTradeoffChartData(*report));
    else
        m_contributions->setData(buildContributionsChartData(*report));
}

} // namespace tailwise::ui
