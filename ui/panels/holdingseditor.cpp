#include "holdingseditor.h"

#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/savefile.h"
#include "document/workbook.h"
#include "panels/elidedlabel.h"
#include "panels/tablecolumns.h"
#include "holdingspaste.h"
#include "text/numbers.h"
#include "models/holdingsmodel.h"

#include "tailwise/holdings.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QCompleter>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QSortFilterProxyModel>
#include <QStyledItemDelegate>
#include <QTableView>
#include <QToolButton>
#include <QToolTip>
#include <QVBoxLayout>

namespace tailwise::ui {

namespace {

// The asset cell edits with completion over the price history's column names.
class AssetDelegate : public QStyledItemDelegate {
public:
    AssetDelegate(Workbook &workbook, QObject *parent) : QStyledItemDelegate(parent), m_workbook(workbook) {}

    QWidget *createEditor(QWidget *parent, const QStyleOptionViewItem &option, const QModelIndex &index) const override
    {
        if (index.column() != HoldingsModel::AssetColumn)
            return QStyledItemDelegate::createEditor(parent, option, index);
        auto *editor = new QLineEdit(parent);
        QStringList names;
        for (const auto &a : m_workbook.prices().assets)
            names << QString::fromStdString(a);
        auto *completer = new QCompleter(names, editor);
        completer->setCaseSensitivity(Qt::CaseInsensitive);
        completer->setFilterMode(Qt::MatchContains);
        editor->setCompleter(completer);
        return editor;
    }

private:
    Workbook &m_workbook;
};

// The first asset of the price history that no holding has yet, or empty.
std::string firstUnheldAsset(const Workbook &wb)
{
    for (const auto &asset : wb.prices().assets) {
        const bool held = std::any_of(wb.holdings().begin(), wb.holdings().end(),
                                      [&](const Holding &h) { return h.asset == asset; });
        if (!held)
            return asset;
    }
    return {};
}

} // namespace

HoldingsEditor::HoldingsEditor(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    m_model = new HoldingsModel(workbook, this);
    m_proxy = new QSortFilterProxyModel(this);
    m_proxy->setSourceModel(m_model);
    m_proxy->setSortRole(HoldingsModel::SortRole);
    m_proxy->setDynamicSortFilter(false); // rows do not jump while the user is editing them

    m_view = new QTableView(this);
    m_view->setObjectName(QStringLiteral("holdingsTable"));
    m_view->setAccessibleName(tr("Holdings")); // the sheet's name when the table is exported
    m_view->setModel(m_proxy);
    m_view->setItemDelegate(new AssetDelegate(workbook, m_view));
    m_view->setSortingEnabled(true);
    m_view->sortByColumn(-1, Qt::AscendingOrder); // file order until the user picks a column
    m_view->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_view->setEditTriggers(QAbstractItemView::DoubleClicked | QAbstractItemView::EditKeyPressed
                            | QAbstractItemView::AnyKeyPressed | QAbstractItemView::SelectedClicked);
    m_view->setAlternatingRowColors(true);
    m_view->verticalHeader()->setDefaultSectionSize(m_view->fontMetrics().height() + 8);
    m_view->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    // Columns keep their fitted widths; a stretched last column would push its figures far from the rest.
    m_view->horizontalHeader()->setStretchLastSection(false);
    m_view->horizontalHeader()->setMinimumSectionSize(70);
    m_view->setWordWrap(false);

    auto *title = new QLabel(tr("<b>Holdings</b>"), this);
    // Elided when space is short, so that the hint never sets the window's minimum width.
    auto *hint = new ElidedLabel(this);
    hint->setFullText(tr("Double-click a cell to edit; paste rows from a spreadsheet with %1.")
                          .arg(QKeySequence(QKeySequence::Paste).toString(QKeySequence::NativeText)));
    hint->setStyleSheet(QStringLiteral("color: palette(mid);"));
    m_buttonRow = new QWidget(this);
    auto *buttons = new QHBoxLayout(m_buttonRow);
    buttons->setContentsMargins(0, 0, 0, 0);
    buttons->setSpacing(4);

    auto *top = new QHBoxLayout;
    top->addWidget(title);
    top->addSpacing(12);
    top->addWidget(hint, 1);
    top->addWidget(m_buttonRow);

    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addLayout(top);
    layout->addWidget(m_view, 1);

    connect(m_model, &HoldingsModel::editRefused, this, &HoldingsEditor::showRefusal);
    // Fit columns to their content when a new set of holdings arrives (open, import, first results).
    // Risk columns fill in with the first results, so they are fitted again then.
    connect(m_model, &QAbstractItemModel::modelReset, this, [this] {
        fitColumnsCapped(m_view);
        m_fitPending = true;
    });
    connect(&workbook.results(), &ResultsStore::headlineChanged, this, [this] {
        if (m_fitPending && m_workbook.results().report()) {
            fitColumnsCapped(m_view);
            m_fitPending = false;
        }
    });
}

void HoldingsEditor::setRowActions(const QList<QAction *> &actions)
{
    for (QAction *action : actions) {
        auto *button = new QToolButton(m_buttonRow);
        button->setDefaultAction(action);
        button->setToolButtonStyle(Qt::ToolButtonTextOnly);
        m_buttonRow->layout()->addWidget(button);
    }
}

void HoldingsEditor::showRefusal(const QModelIndex &sourceIndex, const QString &reason)
{
    const QModelIndex viewIndex = m_proxy->mapFromSource(sourceIndex);
    const QRect rect = m_view->visualRect(viewIndex);
    QToolTip::showText(m_view->viewport()->mapToGlobal(rect.bottomLeft()), reason, m_view->viewport(), rect, 10000);
    emit statusMessage(reason);
}

void HoldingsEditor::report(const QString &problem, const QString &done)
{
    emit statusMessage(problem.isEmpty() ? done : problem);
}

std::vector<int> HoldingsEditor::selectedRows() const
{
    std::vector<int> rows;
    const auto selection = m_view->selectionModel()->selectedRows();
    for (const QModelIndex &i : selection)
        rows.push_back(m_proxy->mapToSource(i).row());
    if (rows.empty() && m_view->currentIndex().isValid())
        rows.push_back(m_proxy->mapToSource(m_view->currentIndex()).row());
    std::sort(rows.begin(), rows.end());
    return rows;
}

QString HoldingsEditor::addHolding()
{
    QString problem;
    if (!m_workbook.hasPrices())
        problem = tr("Import a price history first: holdings are chosen from its assets.");
    const std::string asset = problem.isEmpty() ? firstUnheldAsset(m_workbook) : std::string();
    if (problem.isEmpty() && asset.empty())
        problem = tr("Every asset of the price history is already held.");
    if (!problem.isEmpty()) {
        report(problem, {});
        return problem;
    }
    Holding h;
    h.asset = asset;
    const int row = static_cast<int>(m_workbook.holdings().size());
    edit::insertHoldings(m_workbook, row, {h}, tr("Add holding %1").arg(QString::fromStdString(asset)));
    const QModelIndex cell = m_proxy->mapFromSource(m_model->index(row, HoldingsModel::QuantityColumn));
    m_view->setCurrentIndex(cell);
    m_view->scrollTo(cell);
    report({}, tr("Added %1 with quantity 0: type its quantity, or change the asset.").arg(QString::fromStdString(asset)));
    return {};
}

QString HoldingsEditor::removeSelected()
{
    const auto rows = selectedRows();
    if (rows.empty()) {
        const QString problem = tr("Select the holdings to remove first.");
        report(problem, {});
        return problem;
    }
    edit::removeHoldings(m_workbook, rows);
    report({}, countText(static_cast<int>(rows.size()), tr("Removed 1 holding."), tr("Removed %1 holdings.")));
    return {};
}

QString HoldingsEditor::duplicateSelected()
{
    // Two rows of one asset are not allowed (core refuses them), so the copy takes the first
    // asset not yet held and the user then chooses its asset.
    const auto rows = selectedRows();
    QString problem;
    if (rows.empty())
        problem = tr("Select the holding to duplicate first.");
    const std::string asset = problem.isEmpty() ? firstUnheldAsset(m_workbook) : std::string();
    if (problem.isEmpty() && asset.empty())
        problem = tr("Every asset of the price history is already held, so a copy has no asset to take.");
    if (!problem.isEmpty()) {
        report(problem, {});
        return problem;
    }
    Holding copy = m_workbook.holdings()[static_cast<std::size_t>(rows.front())];
    const QString from = QString::fromStdString(copy.asset);
    copy.asset = asset;
    const int row = rows.front() + 1;
    edit::insertHoldings(m_workbook, row, {copy}, tr("Duplicate holding %1").arg(from));
    const QModelIndex cell = m_proxy->mapFromSource(m_model->index(row, HoldingsModel::AssetColumn));
    m_view->setCurrentIndex(cell);
    m_view->edit(cell);
    report({}, tr("Copied %1 to a new row; choose the asset it should hold.").arg(from));
    return {};
}

QString HoldingsEditor::pasteText(const QString &text)
{
    if (!m_workbook.hasPrices()) {
        const QString problem = tr("Import a price history first: pasted assets are checked against it.");
        report(problem, {});
        return problem;
    }
    const PastedHoldings pasted = mergePastedHoldings(text, m_workbook.holdings(), m_workbook.prices());
    if (!pasted.error.isEmpty()) {
        report(pasted.error, {});
        return pasted.error;
    }
    edit::replaceHoldings(m_workbook, pasted.holdings,
                          countText(pasted.added + pasted.updated, tr("Paste 1 holding"), tr("Paste %1 holdings")));
    report({}, tr("Pasted: %1 added, %2 updated.").arg(pasted.added).arg(pasted.updated));
    return {};
}

void HoldingsEditor::pasteFromClipboard()
{
    pasteText(QApplication::clipboard()->text());
}

QString HoldingsEditor::importHoldingsFile(const QString &path)
{
    if (!m_workbook.hasPrices()) {
        const QString problem = tr("Import a price history first: the holdings' assets are checked against it.");
        report(problem, {});
        return problem;
    }
    auto read = readHoldingsCsv(path.toStdString(), &m_workbook.prices());
    if (!read) {
        const QString problem = QString::fromStdString(read.error().message);
        report(problem, {});
        return problem;
    }
    edit::replaceHoldings(m_workbook, read.value(), tr("Import holdings from %1").arg(QFileInfo(path).fileName()));
    m_workbook.noteImportedFrom(path);
    report({}, countText(static_cast<int>(read.value().size()), tr("Imported 1 holding from %2."), tr("Imported %1 holdings from %2."))
                   .replace(QLatin1String("%2"), QFileInfo(path).fileName()));
    return {};
}

QString HoldingsEditor::exportHoldingsFile(const QString &path) const
{
    if (const QString refusal = refusalToOverwriteInput(path, m_workbook.inputFiles()); !refusal.isEmpty())
        return refusal;
    const std::string csv = writeHoldingsCsv(m_workbook.holdings());
    if (auto saved = saveFile(path, QByteArray(csv.data(), static_cast<qsizetype>(csv.size()))); !saved)
        return QString::fromStdString(saved.error().message);
    return {};
}

} // namespace tailwise::ui
