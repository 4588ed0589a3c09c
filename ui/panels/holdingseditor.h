// HoldingsEditor: the holdings table and its row commands. Edits go through HoldingsModel (cell
// by cell) or through the row functions below, each one undo step. A refused cell says why in a
// tooltip at the cell and on the status line (statusMessage).
#pragma once

#include <QWidget>

#include <vector>

class QAction;
class QSortFilterProxyModel;
class QTableView;

namespace tailwise::ui {

class HoldingsModel;
class Workbook;

class HoldingsEditor : public QWidget {
    Q_OBJECT
public:
    explicit HoldingsEditor(Workbook &workbook, QWidget *parent = nullptr);

    QTableView *tableView() const { return m_view; }
    HoldingsModel *model() const { return m_model; }
    // Shows these actions as buttons above the table (the window owns them).
    void setRowActions(const QList<QAction *> &actions);

    // Each returns an empty string on success, or the reason nothing changed.
    QString addHolding();
    QString removeSelected();
    QString duplicateSelected();
    QString pasteText(const QString &text);
    QString importHoldingsFile(const QString &path);
    QString exportHoldingsFile(const QString &path) const;

public slots:
    void pasteFromClipboard();

signals:
    void statusMessage(const QString &text);

private:
    std::vector<int> selectedRows() const;
    void showRefusal(const QModelIndex &sourceIndex, const QString &reason);
    void report(const QString &problem, const QString &done);

    Workbook &m_workbook;
    HoldingsModel *m_model = nullptr;
    QSortFilterProxyModel *m_proxy = nullptr;
    QTableView *m_view = nullptr;
    QWidget *m_buttonRow = nullptr;
    bool m_fitPending = true;
};

} // namespace tailwise::ui
