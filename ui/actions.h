// Actions: every command of the window's menus in one place — texts, shortcuts, status tips —
// and the menus built from them. The window connects them to what they do; this class only
// holds them. Undo and Redo come from the workbook's undo stack, so their texts name the step.
#pragma once

#include <QKeySequence>
#include <QObject>

#include <array>

class QAction;
class QMainWindow;
class QMenu;
class QUndoStack;

namespace tailwise::ui {

class Actions : public QObject {
    Q_OBJECT
public:
    enum Id {
        New,
        Open,
        Save,
        SaveAs,
        ImportPrices,
        ImportHoldings,
        ExportHoldings,
        ExportChart,
        CopyChart,
        ExportReport,
        Quit,
        Undo,
        Redo,
        AddHolding,
        RemoveHolding,
        DuplicateHolding,
        Paste,
        About,
        Count
    };

    Actions(QUndoStack *undoStack, QObject *parent);

    QAction *get(Id id) const { return m_actions[static_cast<std::size_t>(id)]; }
    // Builds the menu bar of `window`.
    void buildMenus(QMainWindow *window);
    // Refills File ▸ Recent from the list (newest first).
    void setRecentFiles(const QStringList &paths);

signals:
    void recentFileChosen(const QString &path);

private:
    QAction *make(Id id, const QString &text, const QString &tip, QKeySequence::StandardKey key = QKeySequence::UnknownKey);

    std::array<QAction *, Count> m_actions{};
    QMenu *m_recent = nullptr;
};

} // namespace tailwise::ui
