// HoldingsModel: the workbook's holdings as a table, with each holding's risk from the latest
// results. It holds no data of its own: rows are the workbook's holdings, risk columns read the
// workbook's report. Edits become undo commands (commands.h); a value a cell cannot take is
// refused with the reason (editRefused) and the holding stays as it was.
//
// Sorting is a view matter: put a QSortFilterProxyModel in front and sort by SortRole, which
// gives the raw number (DisplayRole is locale text).
#pragma once

#include <QAbstractTableModel>

namespace tailwise {
struct Holding;
}

namespace tailwise::ui {

class Workbook;

class HoldingsModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column {
        AssetColumn,
        QuantityColumn,
        PriceColumn,
        MarketValueColumn,
        WeightColumn,
        StandaloneVarColumn,
        VarShareColumn,
        ColumnCount
    };
    enum Role {
        SortRole = Qt::UserRole + 1, // raw number (or the asset name) for sorting
    };

    explicit HoldingsModel(Workbook &workbook, QObject *parent = nullptr);

    int rowCount(const QModelIndex &parent = {}) const override;
    int columnCount(const QModelIndex &parent = {}) const override;
    QVariant data(const QModelIndex &index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;
    Qt::ItemFlags flags(const QModelIndex &index) const override;
    // Accepts text (typed, locale or C form) or a number. Refuses with editRefused and returns
    // false for: a non-number, an asset the price history lacks, an asset held in another row,
    // a price ≤ 0.
    bool setData(const QModelIndex &index, const QVariant &value, int role = Qt::EditRole) override;

    Workbook &workbook() const { return m_workbook; }

signals:
    void editRefused(const QModelIndex &index, const QString &reason);

private:
    bool refuse(const QModelIndex &index, const QString &reason);
    // Risk columns read the report only when it was computed for these holdings (same rows,
    // same assets); otherwise they stay blank until the new results arrive.
    bool reportMatches(int row) const;
    QVariant displayValue(int row, int column) const;
    std::optional<double> numberValue(int row, int column) const;
    void emitRiskColumnsChanged();

    Workbook &m_workbook;
};

} // namespace tailwise::ui
