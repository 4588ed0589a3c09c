// ModelComparisonModel: the rows of core's compareModels (comparison.h) as a table — VaR and ES
// of every model at the same assumptions, in money and as a share of the portfolio's value, and
// each one's difference from the normal model. It computes nothing: setRows() takes core's rows
// as they are; differences and shares are plain subtraction and division of core's figures.
// A model that failed shows its reason in the Note column and dashes in the figures.
#pragma once

#include "tailwise/comparison.h"

#include <QAbstractTableModel>

#include <vector>

namespace tailwise::ui {

class ModelComparisonModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column {
        ModelColumn,
        VarColumn,
        VarPercentColumn,
        VarVsNormalColumn,
        EsColumn,
        EsPercentColumn,
        EsVsNormalColumn,
        NoteColumn,
        ColumnCount
    };
    enum Role {
        ValueRole = Qt::UserRole + 1, // the raw number (money or fraction) behind a figure cell
    };

    explicit ModelComparisonModel(QObject *parent = nullptr);

    // `portfolioValue` V for the shares (shares are blank when V ≤ 0).
    void setRows(std::vector<tailwise::ModelRow> rows, double portfolioValue);
    void clear();
    const std::vector<tailwise::ModelRow> &rows() const { return m_rows; }

    int rowCount(const QModelIndex &parent = {}) const override;
    int columnCount(const QModelIndex &parent = {}) const override;
    QVariant data(const QModelIndex &index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    static QString modelName(tailwise::RiskModel model);

private:
    std::optional<double> value(int row, int column) const;
    const tailwise::ModelRow *normalRow() const;

    std::vector<tailwise::ModelRow> m_rows;
    double m_value = 0.0;
};

} // namespace tailwise::ui
