#include "modelcomparisonmodel.h"

#include "text/assumptionlabels.h"
#include "text/numbers.h"

#include <QBrush>
#include <QColor>

#include <cmath>

namespace tailwise::ui {

ModelComparisonModel::ModelComparisonModel(QObject *parent) : QAbstractTableModel(parent) {}

void ModelComparisonModel::setRows(std::vector<ModelRow> rows, double portfolioValue)
{
    beginResetModel();
    m_rows = std::move(rows);
    m_value = portfolioValue;
    endResetModel();
}

void ModelComparisonModel::clear()
{
    beginResetModel();
    m_rows.clear();
    endResetModel();
}

int ModelComparisonModel::rowCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_rows.size());
}

int ModelComparisonModel::columnCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QString ModelComparisonModel::modelName(RiskModel model)
{
    return modelLabel(model); // the one list of model names, assumptionlabels.h
}

const ModelRow *ModelComparisonModel::normalRow() const
{
    for (const ModelRow &r : m_rows)
        if (r.model == RiskModel::Normal && r.figures)
            return &r;
    return nullptr;
}

std::optional<double> ModelComparisonModel::value(int row, int column) const
{
    const ModelRow &r = m_rows[static_cast<std::size_t>(row)];
    if (!r.figures)
        return std::nullopt;
    const ModelRow *normal = normalRow();
    const bool shares = m_value > 0.0 && std::isfinite(m_value);
    std::optional<double> v;
    switch (column) {
    case VarColumn: v = r.figures->var; break;
    case EsColumn: v = r.figures->es; break;
    case VarPercentColumn: if (shares) v = r.figures->var / m_value; break;
    case EsPercentColumn: if (shares) v = r.figures->es / m_value; break;
    case VarVsNormalColumn: if (normal) v = r.figures->var - normal->figures->var; break;
    case EsVsNormalColumn: if (normal) v = r.figures->es - normal->figures->es; break;
    default: break;
    }
    if (v && !std::isfinite(*v))
        return std::nullopt;
    return v;
}

QVariant ModelComparisonModel::data(const QModelIndex &index, int role) const
{
    if (!index.isValid() || index.row() < 0 || index.row() >= rowCount() || index.column() < 0
        || index.column() >= ColumnCount)
        return {};
    const ModelRow &r = m_rows[static_cast<std::size_t>(index.row())];
    const int c = index.column();
    if (role == Qt::TextAlignmentRole)
        return c == ModelColumn || c == NoteColumn ? QVariant(Qt::AlignLeft | Qt::AlignVCenter)
                                                   : QVariant(Qt::AlignRight | Qt::AlignVCenter);
    if (c == ModelColumn) {
        if (role == Qt::DisplayRole)
            return r.used != r.model ? tr("%1 (as %2)").arg(modelName(r.model), modelName(r.used)) : modelName(r.model);
        return {};
    }
    if (c == NoteColumn) {
        if (role != Qt::DisplayRole && role != Qt::ToolTipRole)
            return {};
        QStringList notes;
        if (!r.error.empty())
            notes << QString::fromStdString(r.error);
        if (r.varStandardError && std::isfinite(*r.varStandardError))
            notes << tr("VaR ± %1 (standard error)").arg(moneyText(*r.varStandardError, 0));
        for (const auto &w : r.warnings)
            notes << QString::fromStdString(w);
        return role == Qt::ToolTipRole ? notes.join(QLatin1Char('\n')) : notes.join(QStringLiteral("; "));
    }
    const auto v = value(index.row(), c);
    if (role == ValueRole)
        return v ? QVariant(*v) : QVariant();
    if (role == Qt::ForegroundRole && v && (c == VarVsNormalColumn || c == EsVsNormalColumn) && *v > 0.0)
        return QBrush(QColor(0x9a, 0x3b, 0x1e)); // more loss than the normal model says
    if (role != Qt::DisplayRole)
        return {};
    switch (c) {
    case VarColumn:
    case EsColumn: return v ? moneyText(*v, 0) : QStringLiteral("\u2014");
    case VarPercentColumn:
    case EsPercentColumn: return percentText(v, 2);
    case VarVsNormalColumn:
    case EsVsNormalColumn:
        if (!v)
            return QStringLiteral("\u2014");
        return (*v > 0 ? QStringLiteral("+") : QString()) + moneyText(*v, 0);
    default: return {};
    }
}

QVariant ModelComparisonModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || section < 0 || section >= ColumnCount)
        return {};
    if (role == Qt::DisplayRole) {
        switch (section) {
        case ModelColumn: return tr("Model");
        case VarColumn: return tr("VaR");
        case VarPercentColumn: return tr("VaR % of value");
        case VarVsNormalColumn: return tr("VaR vs normal");
        case EsColumn: return tr("ES");
        case EsPercentColumn: return tr("ES % of value");
        case EsVsNormalColumn: return tr("ES vs normal");
        case NoteColumn: return tr("Notes");
        default: break;
        }
    }
    if (role == Qt::ToolTipRole) {
        switch (section) {
        case VarVsNormalColumn: return tr("This model's VaR minus the normal model's: positive means it sees more risk.");
        case EsVsNormalColumn: return tr("This model's ES minus the normal model's.");
        default: break;
        }
    }
    return {};
}

} // namespace tailwise::ui
