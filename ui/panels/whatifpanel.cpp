#include "whatifpanel.h"

#include "charts/losstailchart.h"
#include "charts/losstailchartdata.h"
#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "panels/tablecolumns.h"
#include "text/numbers.h"

#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFrame>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QProgressBar>
#include <QPushButton>
#include <QScrollArea>
#include <QSplitter>
#include <QTableWidget>
#include <QToolButton>
#include <QVBoxLayout>

#include <cmath>
#include <map>

namespace tailwise::ui {

namespace {

enum TradeColumn { TradeAsset, TradeChange, TradeHeld, TradeColumnCount };
enum ContributionColumn { CAsset, CQuantityBefore, CQuantityAfter, CVarBefore, CVarAfter, CVarChange, CColumnCount };

QTableWidgetItem *readOnly(const QString &text, Qt::Alignment align = Qt::AlignRight | Qt::AlignVCenter)
{
    auto *item = new QTableWidgetItem(text);
    showWholeTextInTooltip(item);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
    item->setTextAlignment(align);
    return item;
}

QString signedMoney(double v)
{
    return (v > 0 ? QStringLiteral("+") : QString()) + moneyText(v, 0);
}

} // namespace

WhatIfPanel::WhatIfPanel(Workbook &workbook, QWidget *parent)
    : QWidget(parent), m_workbook(workbook)
{
    auto *intro = new QLabel(tr("Try trades before making them: add a row per asset and the change in quantity "
                                "(negative to sell). Nothing changes until you apply."),
                             this);
    intro->setWordWrap(true);

    m_trades = new QTableWidget(0, TradeColumnCount, this);
    m_trades->setObjectName(QStringLiteral("whatIfTrades"));
    m_trades->setHorizontalHeaderLabels({tr("Asset"), tr("Change in quantity"), tr("Held now")});
    m_trades->verticalHeader()->hide();
    m_trades->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
    m_trades->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_trades->setMinimumHeight(80);
    m_addTrade = new QToolButton(this);
    m_addTrade->setText(tr("Add trade"));
    m_removeTrade = new QToolButton(this);
    m_removeTrade->setText(tr("Remove trade"));
    m_apply = new QPushButton(tr("Apply to holdings"), this);
    m_apply->setObjectName(QStringLiteral("whatIfApply"));
    m_apply->setToolTip(tr("Change the holdings by these trades, as one step you can undo."));
    m_discard = new QPushButton(tr("Discard"), this);
    m_discard->setToolTip(tr("Forget the proposed trades."));
    auto *buttons = new QHBoxLayout;
    buttons->addWidget(m_addTrade);
    buttons->addWidget(m_removeTrade);
    buttons->addStretch();
    buttons->addWidget(m_discard);
    buttons->addWidget(m_apply);

    m_figures = new QLabel(this);
    m_figures->setObjectName(QStringLiteral("whatIfFigures"));
    m_figures->setTextFormat(Qt::RichText);
    m_figures->setWordWrap(true);
    m_status = new QLabel(this);
    m_status->setWordWrap(true);
    m_progress = new QProgressBar(this);
    m_progress->setRange(0, 100);
    m_progress->setMaximumWidth(140);
    m_progress->hide();
    m_stop = new QToolButton(this);
    m_stop->setText(tr("Stop"));
    m_stop->hide();
    auto *statusRow = new QHBoxLayout;
    statusRow->addWidget(m_status, 1);
    statusRow->addWidget(m_progress);
    statusRow->addWidget(m_stop);

    m_contributions = new QTableWidget(0, CColumnCount, this);
    m_contributions->setObjectName(QStringLiteral("whatIfContributions"));
    m_contributions->setAccessibleName(tr("Trade contributions")); // the sheet's name when the table is exported
    m_contributions->setHorizontalHeaderLabels({tr("Asset"), tr("Quantity now"), tr("After"), tr("Part of VaR now"),
                                                tr("After"), tr("Change")});
    m_contributions->verticalHeader()->hide();
    m_contributions->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_contributions->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    capColumnWidths(m_contributions);
    m_contributions->horizontalHeader()->setStretchLastSection(true);

    m_chart = new LossTailChart(this);
    m_chart->setMinimumHeight(120);

    auto *left = new QWidget(this);
    auto *leftLayout = new QVBoxLayout(left);
    leftLayout->setContentsMargins(0, 0, 0, 0);
    leftLayout->addWidget(intro);
    leftLayout->addWidget(m_trades, 1);
    leftLayout->addLayout(buttons);
    leftLayout->addWidget(m_figures);
    leftLayout->addLayout(statusRow);
    leftLayout->addWidget(m_contributions, 2);
    auto *split = new QSplitter(Qt::Horizontal, this);
    // In a scroll area: the tab must not force its height on the window (the headline above it
    // keeps its room on a small screen).
    auto *leftScroll = new QScrollArea(this);
    leftScroll->setWidget(left);
    leftScroll->setWidgetResizable(true);
    leftScroll->setFrameShape(QFrame::NoFrame);
    leftScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    split->addWidget(leftScroll);
    split->addWidget(m_chart);
    split->setStretchFactor(0, 1);
    split->setStretchFactor(1, 1);
    split->setChildrenCollapsible(false);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(split);

    connect(m_addTrade, &QToolButton::clicked, this, [this] {
        const auto &assets = m_workbook.prices().assets;
        if (assets.empty())
            return;
        addTradeRow(Trade{assets.front(), 0.0});
        proposalEdited();
    });
    connect(m_removeTrade, &QToolButton::clicked, this, [this] {
        const int row = m_trades->currentRow();
        if (row < 0)
            return;
        m_trades->removeRow(row);
        proposalEdited();
    });
    connect(m_apply, &QPushButton::clicked, this, &WhatIfPanel::apply);
    connect(m_discard, &QPushButton::clicked, this, &WhatIfPanel::discard);
    ResultsStore &store = workbook.results();
    connect(m_stop, &QToolButton::clicked, this, [this] {
        m_workbook.results().cancel(Part::WhatIf);
        m_status->setText(tr("Stopped; change a trade to compute again."));
    });
    connect(&store, &ResultsStore::progress, this, [this](Part part, double f) {
        if (part == Part::WhatIf)
            m_progress->setValue(static_cast<int>(f * 100.0));
    });
    connect(&store, &ResultsStore::statusChanged, this, [this](Part part) {
        if (part != Part::WhatIf)
            return;
        const bool running = m_workbook.results().isRunning(Part::WhatIf);
        m_progress->setVisible(running);
        m_stop->setVisible(running);
        if (running) {
            m_progress->setValue(0);
            m_status->setText(tr("Simulating before and after…"));
        }
    });
    // The store recomputes the same proposal on the new portfolio when the holdings or
    // assumptions change (while this panel is in view).
    connect(&store, &ResultsStore::whatIfChanged, this, &WhatIfPanel::refresh);
    connect(&store, &ResultsStore::headlineChanged, this, [this] {
        if (!m_workbook.results().whatIf())
            refresh(); // the "now" curve without a proposal
    });
    connect(&workbook, &Workbook::currencyChanged, this, &WhatIfPanel::refresh);
    connect(&workbook, &Workbook::pricesChanged, this, &WhatIfPanel::refreshAssets);
    connect(&workbook, &Workbook::contentsReset, this, [this] { setTrades({}); });
    refresh();
}

void WhatIfPanel::showEvent(QShowEvent *event)
{
    QWidget::showEvent(event);
    m_workbook.results().setWatched(Part::WhatIf, true);
}

void WhatIfPanel::hideEvent(QHideEvent *event)
{
    QWidget::hideEvent(event);
    m_workbook.results().setWatched(Part::WhatIf, false);
}

void WhatIfPanel::refreshAssets()
{
    std::vector<Trade> kept;
    for (const Trade &t : trades())
        if (m_workbook.prices().assetIndex(t.asset) >= 0)
            kept.push_back(t);
    setTrades(kept);
}

void WhatIfPanel::addTradeRow(const Trade &trade)
{
    m_filling = true;
    const int row = m_trades->rowCount();
    m_trades->insertRow(row);
    auto *asset = new QComboBox(m_trades);
    for (const std::string &name : m_workbook.prices().assets)
        asset->addItem(QString::fromStdString(name));
    asset->setCurrentText(QString::fromStdString(trade.asset));
    asset->setToolTip(tr("Any asset of the price history, held or not."));
    auto *change = new QDoubleSpinBox(m_trades);
    change->setRange(-1e12, 1e12);
    change->setDecimals(4);
    change->setKeyboardTracking(false);
    change->setGroupSeparatorShown(true);
    change->setValue(trade.change);
    change->setToolTip(tr("Units to buy (positive) or sell (negative); money for a holding given by value."));
    m_trades->setCellWidget(row, TradeAsset, asset);
    m_trades->setCellWidget(row, TradeChange, change);
    m_trades->setItem(row, TradeHeld, readOnly(QString()));
    connect(asset, &QComboBox::currentIndexChanged, this, &WhatIfPanel::proposalEdited);
    connect(change, &QDoubleSpinBox::valueChanged, this, &WhatIfPanel::proposalEdited);
    m_filling = false;
}

std::vector<Trade> WhatIfPanel::trades() const
{
    std::vector<Trade> out;
    for (int row = 0; row < m_trades->rowCount(); ++row) {
        const auto *asset = qobject_cast<QComboBox *>(m_trades->cellWidget(row, TradeAsset));
        const auto *change = qobject_cast<QDoubleSpinBox *>(m_trades->cellWidget(row, TradeChange));
        if (!asset || !change || asset->currentText().isEmpty())
            continue;
        out.push_back(Trade{asset->currentText().toStdString(), change->value()});
    }
    return out;
}

void WhatIfPanel::setTrades(const std::vector<Trade> &trades)
{
    m_filling = true;
    m_trades->setRowCount(0);
    for (const Trade &t : trades)
        addTradeRow(t);
    m_filling = false;
    proposalEdited();
}

void WhatIfPanel::proposalEdited()
{
    if (m_filling)
        return;
    // "Held now" beside each trade, from the workbook's holdings (no figure: just the quantity).
    for (int row = 0; row < m_trades->rowCount(); ++row) {
        const auto *asset = qobject_cast<QComboBox *>(m_trades->cellWidget(row, TradeAsset));
        QString held = tr("not held");
        for (const Holding &h : m_workbook.holdings())
            if (asset && h.asset == asset->currentText().toStdString())
                held = quantityText(h.quantity);
        if (auto *item = m_trades->item(row, TradeHeld))
            item->setText(held);
    }
    recompute();
}

QString WhatIfPanel::problem() const
{
    const auto &result = m_workbook.results().whatIf();
    return result && !*result ? QString::fromStdString(result->error().message) : QString();
}

std::optional<WhatIf> WhatIfPanel::result() const
{
    const auto &result = m_workbook.results().whatIf();
    if (!result || !*result)
        return std::nullopt;
    return result->value();
}

void WhatIfPanel::recompute()
{
    std::vector<Trade> proposal = trades();
    const bool any = std::any_of(proposal.begin(), proposal.end(), [](const Trade &t) { return t.change != 0.0; });
    if (!any)
        proposal.clear(); // nothing would change: nothing to compute
    m_workbook.results().setWhatIfTrades(std::move(proposal));
    refresh();
}

void WhatIfPanel::computeNow()
{
    m_workbook.results().computeNow(Part::WhatIf);
}

void WhatIfPanel::refresh()
{
    const auto &stored = m_workbook.results().whatIf();
    m_contributions->setRowCount(0);
    if (!stored || !*stored) {
        const QString why = problem();
        m_figures->setText(QString());
        if (!m_workbook.results().isRunning(Part::WhatIf))
            m_status->setText(why.isEmpty() ? tr("Add a trade to see what it would do.") : tr("No figures: %1").arg(why));
        m_apply->setEnabled(false);
        m_discard->setEnabled(m_trades->rowCount() > 0);
        LossTailOptions now;
        now.currency = m_workbook.currency();
        const auto &report = m_workbook.results().report();
        m_chart->setData(report ? buildLossTailChartData(*report, now) : LossTailChartData{});
        return;
    }
    const WhatIf &w = stored->value();
    const WhatIfFigures &f = w.figures;
    const QString row = QStringLiteral("<tr><td>%1</td><td align=right>&nbsp;&nbsp;<b>%2</b></td></tr>");
    QString html = QStringLiteral("<table>");
    html += row.arg(tr("VaR now"), moneyText(f.varBefore, 0));
    html += row.arg(tr("VaR after the trades"), moneyText(f.varAfter, 0));
    html += row.arg(tr("Incremental VaR (exact)"), signedMoney(f.incrementalVar));
    html += row.arg(tr("Marginal-VaR estimate"), signedMoney(f.marginalEstimate));
    html += row.arg(tr("Gap (exact − estimate)"), signedMoney(f.estimateGap));
    html += QStringLiteral("</table>");
    m_figures->setText(html);
    QString status = tr("A large gap means the trades are too big for the marginal estimate to be trusted.");
    for (const auto &warning : w.warnings)
        status += QLatin1Char(' ') + QString::fromStdString(warning);
    m_status->setText(status);
    m_status->setToolTip(QString::fromStdString(w.marginalMethod));

    // Contributions on the common asset list (before.holdings and after.holdings align by row).
    const auto &before = w.before.holdings;
    const auto &after = w.after.holdings;
    m_contributions->setRowCount(static_cast<int>(before.size()));
    for (std::size_t i = 0; i < before.size(); ++i) {
        const int r = static_cast<int>(i);
        const HoldingRisk *a = i < after.size() ? &after[i] : nullptr;
        m_contributions->setItem(r, CAsset, readOnly(QString::fromStdString(before[i].asset), Qt::AlignLeft | Qt::AlignVCenter));
        m_contributions->setItem(r, CQuantityBefore, readOnly(quantityText(before[i].quantity)));
        m_contributions->setItem(r, CQuantityAfter, readOnly(a ? quantityText(a->quantity) : QString()));
        m_contributions->setItem(r, CVarBefore, readOnly(moneyText(before[i].componentVar, 0)));
        m_contributions->setItem(r, CVarAfter, readOnly(a ? moneyText(a->componentVar, 0) : QString()));
        m_contributions->setItem(r, CVarChange, readOnly(a ? signedMoney(a->componentVar - before[i].componentVar) : QString()));
    }
    m_apply->setEnabled(true);
    m_discard->setEnabled(true);

    LossTailOptions options;
    options.currency = m_workbook.currency();
    options.ghost = &w.before;
    options.ghostLegend = tr("Now, before the trades");
    LossTailChartData data = buildLossTailChartData(w.after, options);
    data.curveLegend = tr("After the trades: %1").arg(data.curveLegend);
    m_chart->setData(data);
}

bool WhatIfPanel::apply()
{
    const std::vector<Trade> proposal = trades();
    if (proposal.empty())
        return false;
    auto after = applyTrades(m_workbook.holdings(), proposal, m_workbook.prices());
    if (!after) {
        m_status->setText(tr("Not applied: %1").arg(QString::fromStdString(after.error().message)));
        return false;
    }
    const QString text = proposal.size() == 1
                             ? tr("Trade %1 %2").arg(QString::fromStdString(proposal.front().asset), quantityText(proposal.front().change))
                             : tr("Apply %1 trades").arg(proposal.size());
    edit::replaceHoldings(m_workbook, after.value(), text);
    setTrades({});
    return true;
}

void WhatIfPanel::discard()
{
    setTrades({});
}

} // namespace tailwise::ui
