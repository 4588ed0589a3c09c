#include "workbook.h"

#include "resultsstore.h"

#include <QFileInfo>
#include <QUndoStack>

namespace tailwise::ui {

Workbook::Workbook(QObject *parent) : QObject(parent), m_undo(new QUndoStack(this))
{
    m_results = new ResultsStore(*this);
    connect(m_undo, &QUndoStack::cleanChanged, this, [this](bool) { emit modifiedChanged(isModified()); });
}

Workbook::~Workbook() = default;

void Workbook::setFilePath(const QString &path)
{
    if (path == m_filePath)
        return;
    m_filePath = path;
    emit filePathChanged();
}

bool Workbook::isModified() const
{
    return m_unsavedWithoutUndo || !m_undo->isClean();
}

void Workbook::markSaved(const QString &path)
{
    m_unsavedWithoutUndo = false;
    m_undo->setClean();
    setFilePath(path);
    emit modifiedChanged(isModified());
}

void Workbook::noteImportedFrom(const QString &path)
{
    const QString absolute = QFileInfo(path).absoluteFilePath();
    if (!m_importedFrom.contains(absolute))
        m_importedFrom.append(absolute);
}

QStringList Workbook::inputFiles() const
{
    QStringList all = m_importedFrom;
    if (!m_filePath.isEmpty())
        all.prepend(m_filePath);
    return all;
}

void Workbook::resetContents(WorkbookContents contents, const QString &fromFile)
{
    m_importedFrom.clear();
    replaceContents(std::move(contents), fromFile, false);
}

void Workbook::restoreUnsaved(WorkbookContents contents, const QString &belongsTo)
{
    m_importedFrom.clear();
    replaceContents(std::move(contents), belongsTo, true);
}

void Workbook::replaceContents(WorkbookContents contents, const QString &path, bool unsaved)
{
    emit holdingsAboutToBeReset();
    m_contents = std::move(contents);
    m_contents.warnings.clear(); // shown once, when the file was opened
    m_unsavedWithoutUndo = unsaved; // before clear(), whose cleanChanged reports isModified()
    m_undo->clear();
    setFilePath(path);
    emit holdingsReset();
    emit pricesChanged();
    emit assumptionsChanged();
    emit titleChanged();
    emit currencyChanged();
    emit backtestSettingsChanged();
    emit contentsReset();
    emit modifiedChanged(isModified());
    inputsTouched();
}

void Workbook::inputsTouched()
{
    ++m_generation;
    emit inputsChanged();
}

void Workbook::applyHolding(int row, const Holding &holding)
{
    Q_ASSERT(row >= 0 && row < static_cast<int>(m_contents.holdings.size()));
    m_contents.holdings[static_cast<std::size_t>(row)] = holding;
    emit holdingEdited(row);
    inputsTouched();
}

void Workbook::applyInsertHoldings(int row, const Holdings &holdings)
{
    Q_ASSERT(row >= 0 && row <= static_cast<int>(m_contents.holdings.size()));
    if (holdings.empty())
        return;
    emit holdingsAboutToBeInserted(row, static_cast<int>(holdings.size()));
    m_contents.holdings.insert(m_contents.holdings.begin() + row, holdings.begin(), holdings.end());
    emit holdingsInserted();
    inputsTouched();
}

void Workbook::applyRemoveHoldings(int row, int count)
{
    Q_ASSERT(row >= 0 && count >= 0 && row + count <= static_cast<int>(m_contents.holdings.size()));
    if (count == 0)
        return;
    emit holdingsAboutToBeRemoved(row, count);
    m_contents.holdings.erase(m_contents.holdings.begin() + row, m_contents.holdings.begin() + row + count);
    emit holdingsRemoved();
    inputsTouched();
}

void Workbook::applyHoldings(const Holdings &holdings)
{
    emit holdingsAboutToBeReset();
    m_contents.holdings = holdings;
    emit holdingsReset();
    inputsTouched();
}

void Workbook::applyAssumptions(const Assumptions &assumptions)
{
    m_contents.assumptions = assumptions;
    emit assumptionsChanged();
    inputsTouched();
}

void Workbook::applyPrices(const PriceHistory &prices)
{
    m_contents.prices = prices;
    emit pricesChanged();
    inputsTouched();
}

void Workbook::applyTitle(const QString &title)
{
    m_contents.title = title;
    emit titleChanged();
}

void Workbook::applyCurrency(const QString &currency)
{
    m_contents.currency = currency;
    emit currencyChanged();
}

void Workbook::applyBacktestSettings(const std::optional<BacktestSettings> &settings)
{
    m_contents.backtest = settings;
    emit backtestSettingsChanged();
}

void Workbook::applyScenarios(const std::vector<StressScenario> &scenarios)
{
    m_contents.scenarios = scenarios;
    emit scenariosChanged();
}

} // namespace tailwise::ui
