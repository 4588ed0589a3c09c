#include "holdingsmodel.h"

#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "text/names.h"
#include "text/numbers.h"

#include "tailwise/holdings.h"

#include <QFont>
#include <QLocale>

#include <cmath>
#include <limits>
#include <optional>

namespace tailwise::ui {

namespace {

QString assetName(const Holding &h)
{
    return QString::fromStdString(h.asset);
}

const QList<int> kValueRoles = {Qt::DisplayRole, Qt::EditRole, Qt::ToolTipRole, Qt::FontRole,
                                HoldingsModel::SortRole};

} // namespace

HoldingsModel::HoldingsModel(Workbook &workbook, QObject *parent) : QAbstractTableModel(parent), m_workbook(workbook)
{
    connect(&m_workbook, &Workbook::holdingEdited, this, [this](int row) {
        emit dataChanged(index(row, 0), index(row, ColumnCount - 1), kValueRoles);
    });
    connect(&m_workbook, &Workbook::holdingsAboutToBeInserted, this,
            [this](int first, int count) { beginInsertRows({}, first, first + count - 1); });
    connect(&m_workbook, &Workbook::holdingsInserted, this, [this] { endInsertRows(); });
    connect(&m_workbook, &Workbook::holdingsAboutToBeRemoved, this,
            [this](int first, int count) { beginRemoveRows({}, first, first + count - 1); });
    connect(&m_workbook, &Workbook::holdingsRemoved, this, [this] { endRemoveRows(); });
    connect(&m_workbook, &Workbook::holdingsAboutToBeReset, this, [this] { beginResetModel(); });
    connect(&m_workbook, &Workbook::holdingsReset, this, [this] { endResetModel(); });
    connect(&m_workbook, &Workbook::pricesChanged, this, [this] {
        if (rowCount() > 0)
            emit dataChanged(index(0, PriceColumn), index(rowCount() - 1, MarketValueColumn), kValueRoles);
    });
    connect(&m_workbook.results(), &ResultsStore::headlineChanged, this, &HoldingsModel::emitRiskColumnsChanged);
}

void HoldingsModel::emitRiskColumnsChanged()
{
    if (rowCount() > 0)
        emit dataChanged(index(0, WeightColumn), index(rowCount() - 1, VarShareColumn), kValueRoles);
}

int HoldingsModel::rowCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_workbook.holdings().size());
}

int HoldingsModel::columnCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

bool HoldingsModel::reportMatches(int row) const
{
    const auto &report = m_workbook.results().report();
    if (!report || report->holdings.size() != m_workbook.holdings().size())
        return false;
    const auto r = static_cast<std::size_t>(row);
    return report->holdings[r].asset == m_workbook.holdings()[r].asset;
}

std::optional<double> HoldingsModel::numberValue(int row, int column) const
{
    const Holding &h = m_workbook.holdings()[static_cast<std::size_t>(row)];
    const auto &prices = m_workbook.prices();
    const bool known = prices.assetIndex(h.asset) >= 0;
    std::optional<double> v;
    switch (column) {
    case QuantityColumn:
        if (!h.value)
            v = h.quantity;
        break;
    case PriceColumn:
        if (h.value)
            break;
        if (h.priceOverride)
            v = *h.priceOverride;
        else if (known)
            v = holdingPrice(h, prices);
        break;
    case MarketValueColumn:
        if (h.value || known)
            v = h.value ? *h.value : holdingExposure(h, prices);
        break;
    case WeightColumn:
    case StandaloneVarColumn:
    case VarShareColumn: {
        if (!reportMatches(row))
            break;
        const HoldingRisk &risk = m_workbook.results().report()->holdings[static_cast<std::size_t>(row)];
        if (column == WeightColumn)
            v = risk.weight;
        else if (column == StandaloneVarColumn)
            v = risk.standaloneVar;
        else
            v = risk.componentShare;
        break;
    }
    default:
        break;
    }
    if (v && !std::isfinite(*v))
        v.reset();
    return v;
}

QVariant HoldingsModel::displayValue(int row, int column) const
{
    if (column == AssetColumn)
        return assetName(m_workbook.holdings()[static_cast<std::size_t>(row)]);
    const auto v = numberValue(row, column);
    if (!v)
        return QString();
    switch (column) {
    case QuantityColumn:
        return quantityText(*v);
    case PriceColumn:
        // Two decimals as prices are usually quoted; four for prices below one.
        return moneyText(*v, std::abs(*v) < 1.0 ? 4 : 2);
    case WeightColumn:
    case VarShareColumn:
        return percentText(*v, 2);
    default:
        return moneyText(*v, 0);
    }
}

QVariant HoldingsModel::data(const QModelIndex &index, int role) const
{
    if (!index.isValid() || !checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return {};
    const int row = index.row();
    const int column = index.column();
    const Holding &h = m_workbook.holdings()[static_cast<std::size_t>(row)];
    switch (role) {
    case Qt::DisplayRole:
        return displayValue(row, column);
    case Qt::EditRole:
        if (column == AssetColumn)
            return assetName(h);
        if (column == PriceColumn && !h.priceOverride)
            return QString(); // empty = the last close
        if (const auto v = numberValue(row, column))
            return numberText(*v);
        return QString();
    case SortRole:
        if (column == AssetColumn)
            return assetName(h);
        if (const auto v = numberValue(row, column))
            return *v;
        return QVariant(-std::numeric_limits<double>::max());
    case Qt::TextAlignmentRole:
        return column == AssetColumn ? QVariant(Qt::AlignLeft | Qt::AlignVCenter)
                                     : QVariant(Qt::AlignRight | Qt::AlignVCenter);
    case Qt::FontRole:
        if (column == PriceColumn && h.priceOverride) {
            QFont font;
            font.setItalic(true);
            return font;
        }
        return {};
    case Qt::ToolTipRole:
        if (column == AssetColumn && m_workbook.prices().assetIndex(h.asset) < 0)
            return tr("The price history has no column named %1.").arg(assetName(h));
        if (column == AssetColumn && assetName(h).size() > shortNameChars)
            return assetName(h); // the column may elide a long name (panels/tablecolumns.h)
        if (column == QuantityColumn && h.value)
            return tr("This holding is given by its market value; type a quantity to hold units instead.");
        if (column == PriceColumn && h.priceOverride)
            return tr("Price set by hand (the history's last close is not used). Clear the cell to use the last close.");
        if (column == PriceColumn)
            return tr("Last close in the price history. Type a price to value this holding at it instead.");
        if (column >= WeightColumn && !reportMatches(row))
            return tr("Shown once the figures for the current inputs are ready.");
        return {};
    default:
        return {};
    }
}

namespace {
// The model the figures follow, in words.
QString figuresModelName(const Workbook &workbook)
{
    const auto &report = workbook.results().report();
    switch (report ? report->model.used : workbook.assumptions().model) {
    case RiskModel::Normal: return HoldingsModel::tr("normal");
    case RiskModel::StudentT: return HoldingsModel::tr("Student-t");
    case RiskModel::CornishFisher: return HoldingsModel::tr("Cornish–Fisher");
    case RiskModel::Historical: return HoldingsModel::tr("historical-simulation");
    case RiskModel::MonteCarlo: return HoldingsModel::tr("Monte Carlo");
    }
    return HoldingsModel::tr("normal");
}
} // namespace

QVariant HoldingsModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation == Qt::Vertical) {
        if (role == Qt::DisplayRole && section >= 0 && section < rowCount())
            return section + 1;
        return {};
    }
    if (section < 0 || section >= ColumnCount)
        return {};
    if (role == Qt::DisplayRole) {
        switch (section) {
        case AssetColumn: return tr("Asset");
        case QuantityColumn: return tr("Quantity");
        case PriceColumn: return tr("Price");
        case MarketValueColumn: return tr("Market value");
        case WeightColumn: return tr("Weight");
        case StandaloneVarColumn: return tr("VaR on its own");
        case VarShareColumn: return tr("Share of VaR");
        default: return {};
        }
    }
    if (role == Qt::ToolTipRole) {
        switch (section) {
        case AssetColumn: return tr("A column of the price history. Type to choose from its names.");
        case QuantityColumn: return tr("Units held. A negative quantity is a short position.");
        case PriceColumn: return tr("The price the holding is valued at: the last close, or one you type (shown in italics).");
        case MarketValueColumn: return tr("Quantity × price, in the portfolio's currency.");
        case WeightColumn: return tr("Market value as a share of the portfolio's net value.");
        case StandaloneVarColumn:
            return tr("The Value-at-Risk this holding would have if it were the whole portfolio, under the %1 model "
                      "as the headline.")
                .arg(figuresModelName(m_workbook));
        case VarShareColumn:
            return tr("This holding's part of the portfolio's VaR (its component VaR over the total), under the %1 "
                      "model as the headline. The parts add up to 100%; a negative part is a hedge that lowers the total.")
                .arg(figuresModelName(m_workbook));
        default: return {};
        }
    }
    if (role == Qt::TextAlignmentRole)
        return section == AssetColumn ? QVariant(Qt::AlignLeft | Qt::AlignVCenter)
                                      : QVariant(Qt::AlignRight | Qt::AlignVCenter);
    return {};
}

Qt::ItemFlags HoldingsModel::flags(const QModelIndex &index) const
{
    if (!index.isValid() || !checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid))
        return Qt::NoItemFlags;
    Qt::ItemFlags f = Qt::ItemIsEnabled | Qt::ItemIsSelectable;
    const Holding &h = m_workbook.holdings()[static_cast<std::size_t>(index.row())];
    switch (index.column()) {
    case AssetColumn:
    case QuantityColumn:
        f |= Qt::ItemIsEditable;
        break;
    case PriceColumn:
        if (!h.value)
            f |= Qt::ItemIsEditable;
        break;
    case MarketValueColumn:
        if (h.value)
            f |= Qt::ItemIsEditable;
        break;
    default:
        break;
    }
    return f;
}

bool HoldingsModel::refuse(const QModelIndex &index, const QString &reason)
{
    emit editRefused(index, reason);
    return false;
}

bool HoldingsModel::setData(const QModelIndex &index, const QVariant &value, int role)
{
    if (role != Qt::EditRole || !index.isValid() || !checkIndex(index, CheckIndexOption::IndexIsValid | CheckIndexOption::ParentIsInvalid)
        || !(flags(index) & Qt::ItemIsEditable))
        return false;
    const int row = index.row();
    const Holding &old = m_workbook.holdings()[static_cast<std::size_t>(row)];
    Holding h = old;
    const QString name = assetName(old);
    const QString text = value.typeId() == QMetaType::Double ? numberText(value.toDouble()) : value.toString().trimmed();

    if (index.column() == AssetColumn) {
        if (text.isEmpty())
            return refuse(index, tr("Row %1: an asset needs a name from the price history.").arg(row + 1));
        const std::string asset = text.toStdString();
        if (m_workbook.prices().assetIndex(asset) < 0)
            return refuse(index, tr("Row %1: the price history has no asset named \"%2\".").arg(row + 1).arg(text));
        const auto &all = m_workbook.holdings();
        for (std::size_t i = 0; i < all.size(); ++i)
            if (static_cast<int>(i) != row && all[i].asset == asset)
                return refuse(index, tr("Row %1: %2 is already held in row %3; change that row's quantity instead.")
                                         .arg(row + 1).arg(text).arg(i + 1));
        if (asset == old.asset)
            return true;
        h.asset = asset;
        edit::setHolding(m_workbook, row, h, tr("Change asset %1 to %2").arg(name, text));
        return true;
    }

    if (index.column() == PriceColumn && text.isEmpty()) {
        if (!old.priceOverride)
            return true;
        h.priceOverride.reset();
        edit::setHolding(m_workbook, row, h, tr("Use last close for %1").arg(name));
        return true;
    }

    const auto number = value.typeId() == QMetaType::Double ? std::optional<double>(value.toDouble()) : readNumber(text);
    if (!number || !std::isfinite(*number))
        return refuse(index, tr("Row %1, %2: \"%3\" is not a number.")
                                 .arg(row + 1).arg(headerData(index.column(), Qt::Horizontal).toString(), text));
    switch (index.column()) {
    case QuantityColumn:
        if (!old.value && old.quantity == *number)
            return true;
        h.quantity = *number;
        h.value.reset();
        edit::setHolding(m_workbook, row, h, tr("Change quantity of %1 to %2").arg(name, quantityText(*number)));
        return true;
    case PriceColumn:
        if (!(*number > 0.0))
            return refuse(index, tr("Row %1, Price: a price must be greater than zero, found %2.")
                                     .arg(row + 1).arg(numberText(*number)));
        if (old.priceOverride && *old.priceOverride == *number)
            return true;
        h.priceOverride = *number;
        edit::setHolding(m_workbook, row, h, tr("Set price of %1 to %2").arg(name, numberText(*number)));
        return true;
    case MarketValueColumn:
        if (old.value && *old.value == *number)
            return true;
        h.value = *number;
        edit::setHolding(m_workbook, row, h, tr("Change value of %1 to %2").arg(name, moneyText(*number)));
        return true;
    default:
        return false;
    }
}

} // namespace tailwise::ui
