#include "stresspanel.h"

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
#include <QListWidget>
#include <QScrollArea>
#include <QSplitter>
#include <QTableWidget>
#include <QToolButton>
#include <QVBoxLayout>

#include <cmath>

namespace tailwise::ui {

namespace {

enum OutcomeColumn { OName, ODate, OPnl, OShare, OColumnCount };

QTableWidgetItem *cell(const QString &text, Qt::Alignment align = Qt::AlignRight | Qt::AlignVCenter)
{
    auto *item = new QTableWidgetItem(text);
    showWholeTextInTooltip(item);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
    item->setTextAlignment(align);
    return item;
}

QToolButton *button(const QString &text, const QString &tip, QWidget *parent)
{
    auto *b = new QToolButton(parent);
    b->setText(text);
    b->setToolTip(tip);
    return b;
}

} // namespace

StressPanel::StressPanel(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    m_list = new QListWidget(this);
    m_list->setObjectName(QStringLiteral("stressScenarios"));
    m_list->setToolTip(tr("Double-click a name to rename it."));
    auto *addScenario = button(tr("New scenario"), tr("Add a scenario with no shocks yet."), this);
    auto *removeScenario = button(tr("Remove"), tr("Remove the selected scenario."), this);
    auto *listButtons = new QHBoxLayout;
    listButtons->addWidget(addScenario);
    listButtons->addWidget(removeScenario);
    listButtons->addStretch();

    m_shocks = new QTableWidget(0, 2, this);
    m_shocks->setObjectName(QStringLiteral("stressShocks"));
    m_shocks->setHorizontalHeaderLabels({tr("Asset"), tr("Price change")});
    m_shocks->verticalHeader()->hide();
    m_shocks->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
    m_shocks->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_addShock = button(tr("Add shock"), tr("Shock one more asset in this scenario; assets not listed stay unchanged."), this);
    m_removeShock = button(tr("Remove shock"), tr("Remove the selected shock."), this);
    auto *shockButtons = new QHBoxLayout;
    shockButtons->addWidget(m_addShock);
    shockButtons->addWidget(m_removeShock);
    shockButtons->addStretch();

    m_outcomesTable = new QTableWidget(0, OColumnCount, this);
    m_outcomesTable->setObjectName(QStringLiteral("stressOutcomes"));
    m_outcomesTable->setAccessibleName(tr("Stress")); // the sheet's name when the table is exported
    m_outcomesTable->setHorizontalHeaderLabels({tr("Scenario or day"), tr("Date"), tr("P&L"), tr("% of value")});
    m_outcomesTable->verticalHeader()->hide();
    m_outcomesTable->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_outcomesTable->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    capColumnWidths(m_outcomesTable);
    m_outcomesTable->horizontalHeader()->setStretchLastSection(true);
    m_note = new QLabel(tr("P&L of today's holdings if prices moved at once by the shocks (gains positive), and the "
                           "window's worst days replayed on today's holdings. A stress is one story, not a bound: "
                           "real losses can be larger."),
                        this);
    m_note->setWordWrap(true);

    auto *left = new QWidget(this);
    auto *leftLayout = new QVBoxLayout(left);
    leftLayout->setContentsMargins(0, 0, 0, 0);
    leftLayout->addWidget(new QLabel(tr("<b>Scenarios</b>"), left));
    leftLayout->addWidget(m_list, 1);
    leftLayout->addLayout(listButtons);
    leftLayout->addWidget(new QLabel(tr("<b>Shocks of the selected scenario</b>"), left));
    leftLayout->addWidget(m_shocks, 2);
    leftLayout->addLayout(shockButtons);
    auto *right = new QWidget(this);
    auto *rightLayout = new QVBoxLayout(right);
    rightLayout->setContentsMargins(0, 0, 0, 0);
    rightLayout->addWidget(new QLabel(tr("<b>P&amp;L on the current holdings</b>"), right));
    rightLayout->addWidget(m_outcomesTable, 1);
    rightLayout->addWidget(m_note);
    auto *split = new QSplitter(Qt::Horizontal, this);
    // In a scroll area: the tab must not force its height on the window (the headline above it
    // keeps its room on a small screen).
    auto *leftScroll = new QScrollArea(this);
    leftScroll->setWidget(left);
    leftScroll->setWidgetResizable(true);
    leftScroll->setFrameShape(QFrame::NoFrame);
    leftScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    split->addWidget(leftScroll);
    split->addWidget(right);
    split->setStretchFactor(1, 1);
    split->setChildrenCollapsible(false);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(split);

    connect(addScenario, &QToolButton::clicked, this, [this] {
        auto list = m_workbook.scenarios();
        QString name = tr("New scenario");
        for (int n = 2;; ++n) {
            const bool taken = std::any_of(list.begin(), list.end(), [&](const StressScenario &s) { return s.name == name.toStdString(); });
            if (!taken)
                break;
            name = tr("New scenario %1").arg(n);
        }
        list.push_back(StressScenario{name.toStdString(), {}});
        commit(std::move(list), tr("Add scenario %1").arg(name));
        m_list->setCurrentRow(static_cast<int>(m_workbook.scenarios().size()) - 1);
    });
    connect(removeScenario, &QToolButton::clicked, this, [this] {
        const int row = current();
        if (row < 0)
            return;
        auto list = m_workbook.scenarios();
        const QString name = QString::fromStdString(list[static_cast<std::size_t>(row)].name);
        list.erase(list.begin() + row);
        commit(std::move(list), tr("Remove scenario %1").arg(name));
    });
    connect(m_list, &QListWidget::currentRowChanged, this, [this](int) {
        if (!m_filling)
            showShocks();
    });
    connect(m_list, &QListWidget::itemChanged, this, [this](QListWidgetItem *item) {
        if (m_filling)
            return;
        const int row = m_list->row(item);
        auto list = m_workbook.scenarios();
        if (row < 0 || row >= static_cast<int>(list.size()))
            return;
        const std::string name = item->text().trimmed().toStdString();
        const bool taken = std::any_of(list.begin(), list.end(), [&](const StressScenario &s) { return s.name == name; });
        if (name.empty() || taken) {
            // A scenario needs a name of its own: put the old one back.
            m_filling = true;
            item->setText(QString::fromStdString(list[static_cast<std::size_t>(row)].name));
            m_filling = false;
            return;
        }
        const QString old = QString::fromStdString(list[static_cast<std::size_t>(row)].name);
        list[static_cast<std::size_t>(row)].name = name;
        commit(std::move(list), tr("Rename scenario %1 to %2").arg(old, QString::fromStdString(name)));
    });
    connect(m_addShock, &QToolButton::clicked, this, [this] {
        if (current() < 0 || m_workbook.prices().assets.empty())
            return;
        // The first asset this scenario does not shock yet.
        const auto &shocked = m_workbook.scenarios()[static_cast<std::size_t>(current())].shocks;
        std::string asset;
        for (const auto &a : m_workbook.prices().assets)
            if (std::none_of(shocked.begin(), shocked.end(), [&](const auto &s) { return s.first == a; })) {
                asset = a;
                break;
            }
        if (asset.empty())
            return;
        addShockRow(asset, -0.1);
        commitShocksFromTable();
    });
    connect(m_removeShock, &QToolButton::clicked, this, [this] {
        const int row = m_shocks->currentRow();
        if (row < 0)
            return;
        m_shocks->removeRow(row);
        commitShocksFromTable();
    });
    connect(&workbook, &Workbook::scenariosChanged, this, [this] {
        if (!m_committing)
            rebuild();
    });
    connect(&workbook, &Workbook::pricesChanged, this, &StressPanel::rebuild);
    // The outcomes are the results store's stress part, computed in the background while the
    // panel is in view; the shares need the headline's value.
    connect(&workbook.results(), &ResultsStore::stressChanged, this, &StressPanel::refreshOutcomes);
    connect(&workbook.results(), &ResultsStore::headlineChanged, this, &StressPanel::refreshOutcomes);
    connect(&workbook, &Workbook::currencyChanged, this, &StressPanel::refreshOutcomes);
    rebuild();
    refreshOutcomes();
}

void StressPanel::showEvent(QShowEvent *event)
{
    QWidget::showEvent(event);
    m_workbook.results().setWatched(Part::Stress, true);
}

void StressPanel::hideEvent(QHideEvent *event)
{
    QWidget::hideEvent(event);
    m_workbook.results().setWatched(Part::Stress, false);
}

const std::vector<StressOutcome> &StressPanel::outcomes() const
{
    static const std::vector<StressOutcome> none;
    const auto &stress = m_workbook.results().stress();
    return stress && *stress ? stress->value() : none;
}

int StressPanel::current() const
{
    const int row = m_list->currentRow();
    return row >= 0 && row < static_cast<int>(m_workbook.scenarios().size()) ? row : -1;
}

void StressPanel::commit(std::vector<StressScenario> scenarios, const QString &text)
{
    const bool structural = scenarios.size() != m_workbook.scenarios().size();
    m_committing = !structural; // adding or removing a scenario rebuilds the list
    edit::setScenarios(m_workbook, scenarios, text);
    m_committing = false;
}

void StressPanel::rebuild()
{
    const int keep = m_list->currentRow();
    m_filling = true;
    m_list->clear();
    for (const StressScenario &s : m_workbook.scenarios()) {
        auto *item = new QListWidgetItem(QString::fromStdString(s.name), m_list);
        item->setFlags(item->flags() | Qt::ItemIsEditable);
    }
    const int n = m_list->count();
    if (n > 0)
        m_list->setCurrentRow(std::clamp(keep, 0, n - 1));
    m_filling = false;
    showShocks();
}

void StressPanel::addShockRow(const std::string &asset, double shock)
{
    const bool wasFilling = m_filling;
    m_filling = true;
    const int row = m_shocks->rowCount();
    m_shocks->insertRow(row);
    auto *combo = new QComboBox(m_shocks);
    for (const std::string &name : m_workbook.prices().assets)
        combo->addItem(QString::fromStdString(name));
    combo->setCurrentText(QString::fromStdString(asset));
    auto *spin = new QDoubleSpinBox(m_shocks);
    spin->setRange(-99.99, 1000.0);
    spin->setDecimals(2);
    spin->setSuffix(QStringLiteral("%"));
    spin->setKeyboardTracking(false);
    spin->setValue(shock * 100.0);
    spin->setToolTip(tr("The change of the asset's price in this scenario: −20% means it falls by a fifth."));
    m_shocks->setCellWidget(row, 0, combo);
    m_shocks->setCellWidget(row, 1, spin);
    connect(combo, &QComboBox::currentIndexChanged, this, &StressPanel::commitShocksFromTable);
    connect(spin, &QDoubleSpinBox::valueChanged, this, &StressPanel::commitShocksFromTable);
    m_filling = wasFilling;
}

void StressPanel::showShocks()
{
    m_filling = true;
    m_shocks->setRowCount(0);
    const int row = current();
    if (row >= 0)
        for (const auto &[asset, shock] : m_workbook.scenarios()[static_cast<std::size_t>(row)].shocks)
            addShockRow(asset, shock);
    m_shocks->setEnabled(row >= 0);
    m_addShock->setEnabled(row >= 0);
    m_removeShock->setEnabled(row >= 0);
    m_filling = false;
}

void StressPanel::commitShocksFromTable()
{
    if (m_filling)
        return;
    const int row = current();
    if (row < 0)
        return;
    auto list = m_workbook.scenarios();
    StressScenario &s = list[static_cast<std::size_t>(row)];
    std::vector<std::pair<std::string, double>> shocks;
    for (int r = 0; r < m_shocks->rowCount(); ++r) {
        const auto *combo = qobject_cast<QComboBox *>(m_shocks->cellWidget(r, 0));
        const auto *spin = qobject_cast<QDoubleSpinBox *>(m_shocks->cellWidget(r, 1));
        if (!combo || !spin)
            continue;
        const std::string asset = combo->currentText().toStdString();
        // An asset listed twice keeps its first shock (as the file refuses a repeat).
        if (std::any_of(shocks.begin(), shocks.end(), [&](const auto &x) { return x.first == asset; }))
            continue;
        shocks.emplace_back(asset, spin->value() / 100.0);
    }
    if (shocks == s.shocks)
        return;
    s.shocks = std::move(shocks);
    commit(std::move(list), tr("Edit scenario %1").arg(QString::fromStdString(s.name)));
}

void StressPanel::refreshOutcomes()
{
    m_outcomesTable->setRowCount(0);
    const ResultsStore &store = m_workbook.results();
    if (!m_workbook.hasPrices() || m_workbook.holdings().empty() || !store.stress())
        return;
    if (!*store.stress()) {
        m_note->setText(tr("No stress figures: %1").arg(QString::fromStdString(store.stress()->error().message)));
        return;
    }
    const std::vector<StressOutcome> &outcomes = store.stress()->value();
    // Shares of the net value, when there is a positive one (a share of nothing is not defined).
    const double value = store.report() ? store.report()->portfolioValue : 0.0;
    const bool shares = value > 0.0 && std::isfinite(value);
    m_outcomesTable->setRowCount(static_cast<int>(outcomes.size()));
    for (std::size_t i = 0; i < outcomes.size(); ++i) {
        const StressOutcome &o = outcomes[i];
        const int r = static_cast<int>(i);
        const QString name = o.date ? tr("Worst day %1 of the window").arg(r - static_cast<int>(m_workbook.scenarios().size()) + 1)
                                    : QString::fromStdString(o.name);
        m_outcomesTable->setItem(r, OName, cell(name, Qt::AlignLeft | Qt::AlignVCenter));
        m_outcomesTable->setItem(r, ODate, cell(o.date ? dateText(*o.date) : QString(), Qt::AlignLeft | Qt::AlignVCenter));
        auto *pnl = cell((o.pnl > 0 ? QStringLiteral("+") : QString()) + moneyText(o.pnl, 0));
        if (o.pnl < 0)
            pnl->setForeground(QColor(0x9a, 0x3b, 0x1e));
        m_outcomesTable->setItem(r, OPnl, pnl);
        m_outcomesTable->setItem(r, OShare, cell(shares ? percentText(o.pnl / value, 2) : percentText(std::nullopt)));
    }
}

} // namespace tailwise::ui
