#include "charttabs.h"

#include "charts/contributionschart.h"
#include "charts/losstailchart.h"
#include "charts/tradeoffchart.h"
#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "text/numbers.h"
#include "backtestview.h"
#include "modelcomparisonview.h"
#include "stresspanel.h"
#include "whatifpanel.h"

#include <QAction>
#include <QCheckBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLocale>
#include <QProgressBar>
#include <QPushButton>
#include <QStackedWidget>
#include <QTabWidget>
#include <QToolButton>
#include <QVBoxLayout>

#include <cmath>

namespace tailwise::ui {

namespace {

TradeoffOptions tradeoffOptions(const QString &currency)
{
    TradeoffOptions o;
    o.currency = currency;
    return o;
}

} // namespace

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
    m_overlay = new QCheckBox(tr("Draw the other models' curves"), tailPage);
    m_overlay->setObjectName(QStringLiteral("modelOverlay"));
    m_overlay->setToolTip(tr("Lines: the P&L density the Student-t and Cornish–Fisher models give at the same "
                             "assumptions, over the bars of the window's history (historical and Monte Carlo have "
                             "no curve of their own)."));
    auto *tailOptions = new QHBoxLayout;
    tailOptions->addWidget(m_percent);
    tailOptions->addWidget(m_history);
    tailOptions->addWidget(m_overlay);
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

    m_comparison = new ModelComparisonView(workbook, m_tabs);
    m_tabs->addTab(m_comparison, tr("Models side by side"));
    m_tabs->setTabToolTip(3, tr("VaR and ES of every model at the same assumptions, and how far each is from the normal."));
    m_whatIf = new WhatIfPanel(workbook, m_tabs);
    m_tabs->addTab(m_whatIf, tr("Try a trade"));
    m_tabs->setTabToolTip(4, tr("What proposed trades would do to VaR, before you make them."));
    m_stress = new StressPanel(workbook, m_tabs);
    m_tabs->addTab(m_stress, tr("Stress"));
    m_tabs->setTabToolTip(5, tr("The P&L of named price shocks and of the window's worst days on today's holdings."));

    // The backtest runs its own background jobs and redraws itself (backtestview.h).
    m_backtest = new BacktestView(workbook, m_tabs);
    const int backtestTab = m_tabs->addTab(m_backtest, tr("Backtest"));
    m_tabs->setTabToolTip(backtestTab, tr("Would the model's one-day VaR have held up? Each past day's P&L against "
                                          "its VaR forecast, the exceptions, and the tests' verdict."));

    m_empty = new QLabel(this);
    m_empty->setAlignment(Qt::AlignCenter);
    m_empty->setWordWrap(true);
    m_empty->setText(tr("The charts appear here once there are figures to draw."));

    m_stack = new QStackedWidget(this);
    m_stack->addWidget(m_empty);
    m_stack->addWidget(m_tabs);

    // The horizon-and-confidence grid runs in the background: its progress and a way to stop it.
    m_gridRow = new QWidget(this);
    m_gridRow->setObjectName(QStringLiteral("gridRun"));
    m_gridStatus = new QLabel(m_gridRow);
    m_gridProgress = new QProgressBar(m_gridRow);
    m_gridProgress->setRange(0, 100);
    m_gridProgress->setMaximumWidth(160);
    m_gridStop = new QPushButton(tr("Stop"), m_gridRow);
    m_gridStop->setToolTip(tr("Stop computing the figures across horizons and confidences. The last ones stay, marked "
                              "out of date."));
    m_gridAgain = new QPushButton(tr("Compute again"), m_gridRow);
    auto *gridLayout = new QHBoxLayout(m_gridRow);
    gridLayout->setContentsMargins(4, 2, 4, 2);
    gridLayout->addWidget(m_gridStatus);
    gridLayout->addWidget(m_gridProgress);
    gridLayout->addWidget(m_gridStop);
    gridLayout->addWidget(m_gridAgain);
    gridLayout->addStretch();
    m_gridRow->hide();

    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_stack);
    layout->addWidget(m_gridRow);

    ResultsStore &store = workbook.results();
    store.setGridConfidences(tradeoffGridConfidences(TradeoffOptions{}));
    connect(&store, &ResultsStore::headlineChanged, this, &ChartTabs::refresh);
    connect(&store, &ResultsStore::gridChanged, this, [this] {
        m_stale[1] = true;
        refreshTab(m_tabs->currentIndex());
        refreshGridStatus();
    });
    connect(&store, &ResultsStore::statusChanged, this, [this](Part part) {
        if (part == Part::Grid)
            refreshGridStatus();
    });
    connect(&store, &ResultsStore::progress, this, [this](Part part, double f) {
        if (part == Part::Grid)
            m_gridProgress->setValue(static_cast<int>(std::lround(f * 100.0)));
    });
    connect(m_gridStop, &QPushButton::clicked, this, [this] {
        m_gridStopped = true;
        m_workbook.results().setWatched(Part::Grid, false);
        m_workbook.results().cancel(Part::Grid);
        refreshGridStatus();
    });
    connect(m_gridAgain, &QPushButton::clicked, this, [this] {
        m_gridStopped = false;
        watchGrid();
        m_workbook.results().request(Part::Grid);
        refreshGridStatus();
    });
    // A stopped grid waits for "Compute again" or a change of what it computes from.
    connect(&workbook, &Workbook::inputsChanged, this, [this] {
        if (!m_gridStopped)
            return;
        m_gridStopped = false;
        watchGrid();
        refreshGridStatus();
    });
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::watchGrid);
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::refreshGridStatus);
    connect(&store, &ResultsStore::overlaysChanged, this, [this] {
        if (m_overlay->isChecked())
            refreshLossTail();
    });
    connect(&workbook, &Workbook::contentsReset, this, &ChartTabs::refresh);
    connect(&workbook, &Workbook::currencyChanged, this, &ChartTabs::refresh); // the money axes name it
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::refreshTab);
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::updateChartActions);
    connect(m_percent, &QCheckBox::toggled, this, &ChartTabs::refreshLossTail);
    connect(m_history, &QCheckBox::toggled, this, &ChartTabs::refreshLossTail);
    connect(m_overlay, &QCheckBox::toggled, this, [this] {
        watchOverlays();
        refreshLossTail();
    });
    connect(m_tabs, &QTabWidget::currentChanged, this, &ChartTabs::watchOverlays);
    connect(m_tradeoff, &TradeoffChart::assumptionsPicked, this, [this](int horizonDays, double confidence) {
        Assumptions a = m_workbook.assumptions();
        if (a.horizonDays == horizonDays && a.confidence == confidence)
            return;
        a.horizonDays = horizonDays;
        a.confidence = confidence;
        edit::setAssumptions(m_workbook, a,
                             tr("Pick %1 at %2 on the map").arg(tradingDaysText(horizonDays), confidenceText(confidence)));
    });
    refresh();
}

std::optional<ChartKind> ChartTabs::currentChartKind() const
{
    if (!m_workbook.results().report())
        return std::nullopt;
    const QWidget *page = m_tabs->currentWidget();
    if (page == m_lossTail->parentWidget())
        return ChartKind::LossTail;
    if (page == m_tradeoff)
        return ChartKind::Tradeoff;
    if (page == m_contributions)
        return ChartKind::Contributions;
    if (page == m_comparison)
        return ChartKind::Models;
    if (page == m_backtest)
        return ChartKind::Backtest;
    return std::nullopt;
}

bool ChartTabs::lossTailInPercent() const
{
    return m_percent->isChecked();
}

void ChartTabs::setChartActions(QAction *exportChart, QAction *copyChart)
{
    m_exportChart = exportChart;
    m_copyChart = copyChart;
    auto *corner = new QWidget(m_tabs);
    auto *row = new QHBoxLayout(corner);
    row->setContentsMargins(0, 0, 4, 0);
    row->setSpacing(2);
    for (QAction *action : {exportChart, copyChart}) {
        auto *button = new QToolButton(corner);
        button->setDefaultAction(action);
        button->setAutoRaise(true);
        row->addWidget(button);
    }
    m_tabs->setCornerWidget(corner, Qt::TopRightCorner);
    updateChartActions();
}

void ChartTabs::updateChartActions()
{
    const bool chart = currentChartKind().has_value();
    for (QAction *action : {m_exportChart, m_copyChart})
        if (action)
            action->setEnabled(chart);
}

void ChartTabs::watchOverlays()
{
    // The other models' curves are computed (in the background) only while they are drawn.
    m_workbook.results().setWatched(Part::Overlays, m_overlay->isChecked() && m_tabs->currentIndex() == 0);
}

void ChartTabs::watchGrid()
{
    // The grid is computed (in the background) only while its tab is shown, or for an export.
    m_workbook.results().setWatched(Part::Grid, m_tabs->currentWidget() == m_tradeoff && !m_gridStopped);
}

void ChartTabs::refreshGridStatus()
{
    const PartStatus &status = m_workbook.results().status(Part::Grid);
    const bool onView = m_stack->currentWidget() == m_tabs && m_tabs->currentWidget() == m_tradeoff;
    const bool running = status.state == PartState::Running;
    const bool stopped = m_gridStopped && status.state != PartState::Ready && status.state != PartState::Running;
    m_gridProgress->setVisible(running);
    m_gridStop->setVisible(running);
    m_gridAgain->setVisible(stopped);
    if (running)
        m_gridProgress->setValue(static_cast<int>(std::lround(status.progress * 100.0)));
    m_gridStatus->setText(running ? tr("Computing VaR across horizons and confidences…")
                          : stopped ? tr("Stopped: the figures drawn are of earlier inputs.")
                                    : QString());
    m_gridRow->setVisible(onView && (running || stopped));
}

void ChartTabs::refreshTradeoff()
{
    // The tab's pictures are slices of the store's grid, drawn with the report it rescales.
    const GridRun &run = m_workbook.results().grid();
    if (!run.report || !run.grid) {
        // Nothing computed for this workbook yet (the grid is on its way): never another one's.
        m_tradeoff->setData(TradeoffChartData{});
        return;
    }
    TradeoffOptions options = tradeoffOptions(m_workbook.currency());
    m_tradeoff->setData(buildTradeoffChartData(*run.report, *run.grid, options));
}

void ChartTabs::refreshLossTail()
{
    const ResultsStore &store = m_workbook.results();
    const auto &report = store.report();
    if (!report)
        return;
    LossTailOptions options;
    options.currency = m_workbook.currency();
    options.unit = m_percent->isChecked() ? LossTailUnit::PercentOfValue : LossTailUnit::Money;
    options.showHistory = m_history->isChecked();
    if (m_overlay->isChecked() && store.isReady(Part::Overlays)) {
        // The models with a closed density at the same inputs (the store's overlays part).
        for (const RiskReport &r : store.overlays()) {
            if (r.model.used == report->assumptions.model)
                continue;
            // ν of the horizon figure: the H-day sum's under aggregate multi-day scaling.
            const QString name = r.model.used == RiskModel::StudentT
                                     ? tr("Student-t (ν = %1)").arg(QLocale().toString(
                                           r.model.horizonDof.value_or(r.model.dof.value_or(0.0)), 'f', 1))
                                     : tr("Cornish–Fisher");
            options.overlays.emplace_back(tr("%1 model: VaR %2").arg(name, moneyText(r.figures.var, 0)), &r);
        }
    }
    m_lossTail->setData(buildLossTailChartData(*report, options));
}

namespace {

ContributionsOptions contributionsOptions(const QString &currency)
{
    ContributionsOptions o;
    o.currency = currency;
    return o;
}

} // namespace

void ChartTabs::refresh()
{
    const auto &report = m_workbook.results().report();
    if (!report) {
        const auto &error = m_workbook.results().headlineError();
        const bool nothingYet = !m_workbook.hasPrices() || m_workbook.holdings().empty();
        m_empty->setText(error && !nothingYet ? tr("No charts: %1.").arg(QString::fromStdString(error->message))
                                              : tr("The charts appear here once there are figures to draw."));
        m_stack->setCurrentWidget(m_empty);
        updateChartActions();
        return;
    }
    m_stack->setCurrentWidget(m_tabs);
    updateChartActions();
    // Only the tab on view is redrawn now; the others when they are shown. With hundreds of
    // holdings a redraw of all three would cost more than a frame after every edit.
    m_stale = {true, true, true};
    refreshTab(m_tabs->currentIndex());
}

void ChartTabs::refreshTab(int tab)
{
    const auto &report = m_workbook.results().report();
    if (!report || tab < 0 || tab >= static_cast<int>(m_stale.size()) || !m_stale[static_cast<std::size_t>(tab)])
        return;
    m_stale[static_cast<std::size_t>(tab)] = false;
    if (tab == 0)
        refreshLossTail();
    else if (tab == 1)
        refreshTradeoff();
    else
        m_contributions->setData(buildContributionsChartData(*report, contributionsOptions(m_workbook.currency())));
}

} // namespace tailwise::ui
