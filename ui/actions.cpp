#include "actions.h"

#include <QAction>
#include <QDir>
#include <QFileInfo>
#include <QMainWindow>
#include <QMenu>
#include <QMenuBar>
#include <QUndoStack>

namespace tailwise::ui {

Actions::Actions(QUndoStack *undoStack, QObject *parent) : QObject(parent)
{
    make(New, tr("&New"), tr("Start an empty workbook"), QKeySequence::New);
    make(Open, tr("&Open…"), tr("Open a saved workbook"), QKeySequence::Open);
    make(Save, tr("&Save"), tr("Save the workbook"), QKeySequence::Save);
    make(SaveAs, tr("Save &As…"), tr("Save the workbook under a new name"), QKeySequence::SaveAs);
    make(ImportPrices, tr("Import &Price History…"), tr("Read daily prices from a CSV file (date, then one column per asset)"));
    make(ImportHoldings, tr("Import &Holdings…"), tr("Read holdings from a CSV file (asset, quantity, optional price)"));
    make(ExportHoldings, tr("&Export Holdings…"), tr("Write the holdings to a CSV file"));
    make(ExportChart, tr("Export &Chart…"), tr("Write the chart in view to a PNG, SVG or PDF file, with a caption"));
    get(ExportChart)->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_E));
    make(CopyChart, tr("Cop&y Chart"), tr("Put the chart in view on the clipboard, with its caption"));
    get(CopyChart)->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_C));
    make(ExportReport, tr("Export &Report…"),
         tr("Write a PDF report of the workbook: figures, charts, backtest, assumptions and cautions"));
    get(ExportReport)->setShortcut(QKeySequence(tr("Ctrl+Shift+R")));
    make(Quit, tr("&Quit"), tr("Close the window"), QKeySequence::Quit);
    get(ImportPrices)->setShortcut(QKeySequence(tr("Ctrl+Shift+I")));

    // From the stack: their texts read "Undo Change quantity of …".
    m_actions[Undo] = undoStack->createUndoAction(this, tr("&Undo"));
    m_actions[Undo]->setShortcut(QKeySequence::Undo);
    m_actions[Redo] = undoStack->createRedoAction(this, tr("&Redo"));
    m_actions[Redo]->setShortcut(QKeySequence::Redo);

    make(AddHolding, tr("&Add Holding"), tr("Add a row for an asset not yet held"));
    get(AddHolding)->setShortcut(QKeySequence(tr("Ctrl+Shift+N")));
    make(RemoveHolding, tr("&Remove Holdings"), tr("Remove the selected holdings"), QKeySequence::Delete);
    // Delete belongs to the table (it would otherwise fire while typing in a field elsewhere).
    get(RemoveHolding)->setShortcutContext(Qt::WidgetWithChildrenShortcut);
    make(DuplicateHolding, tr("&Duplicate Holding"), tr("Copy the selected holding into a new row"));
    get(DuplicateHolding)->setShortcut(QKeySequence(tr("Ctrl+D")));
    make(Paste, tr("&Paste Holdings"), tr("Add or update holdings from rows copied in a spreadsheet (asset, tab, quantity)"),
         QKeySequence::Paste);
    get(Paste)->setShortcutContext(Qt::WidgetWithChildrenShortcut);
    make(About, tr("&About Tailwise and Its Limits"), tr("What the figures mean, and what they do not"));
}

QAction *Actions::make(Id id, const QString &text, const QString &tip, QKeySequence::StandardKey key)
{
    auto *action = new QAction(text, this);
    action->setStatusTip(tip);
    action->setToolTip(tip);
    if (key != QKeySequence::UnknownKey)
        action->setShortcuts(key);
    m_actions[static_cast<std::size_t>(id)] = action;
    return action;
}

void Actions::buildMenus(QMainWindow *window)
{
    QMenuBar *bar = window->menuBar();
    QMenu *file = bar->addMenu(tr("&File"));
    file->addAction(get(New));
    file->addAction(get(Open));
    m_recent = file->addMenu(tr("Open &Recent"));
    file->addSeparator();
    file->addAction(get(Save));
    file->addAction(get(SaveAs));
    file->addSeparator();
    file->addAction(get(ImportPrices));
    file->addAction(get(ImportHoldings));
    file->addAction(get(ExportHoldings));
    file->addAction(get(ExportChart));
    file->addSeparator();
    file->addAction(get(ExportReport));
    file->addSeparator();
    file->addAction(get(Quit));

    QMenu *edit = bar->addMenu(tr("&Edit"));
    edit->addAction(get(Undo));
    edit->addAction(get(Redo));
    edit->addSeparator();
    edit->addAction(get(AddHolding));
    edit->addAction(get(DuplicateHolding));
    edit->addAction(get(RemoveHolding));
    edit->addAction(get(Paste));
    edit->addAction(get(CopyChart));

    QMenu *help = bar->addMenu(tr("&Help"));
    help->addAction(get(About));
    setRecentFiles({});
}

void Actions::setRecentFiles(const QStringList &paths)
{
    if (!m_recent)
        return;
    m_recent->clear();
    for (const QString &path : paths) {
        QAction *a = m_recent->addAction(QFileInfo(path).fileName());
        a->setStatusTip(QDir::toNativeSeparators(path));
        a->setToolTip(QDir::toNativeSeparators(path));
        connect(a, &QAction::triggered, this, [this, path] { emit recentFileChosen(path); });
    }
    m_recent->setEnabled(!paths.isEmpty());
}

} // namespace tailwise::ui
