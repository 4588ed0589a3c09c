#include "holdingspaste.h"

#include "text/numbers.h"

#include <QCoreApplication>
#include <QStringList>

#include <algorithm>
#include <set>

namespace tailwise::ui {

namespace {
QString tr(const char *text)
{
    return QCoreApplication::translate("HoldingsPaste", text);
}
} // namespace

PastedHoldings mergePastedHoldings(const QString &text, const Holdings &current, const PriceHistory &prices)
{
    PastedHoldings out;
    out.holdings = current;
    QStringList lines = text.split(QLatin1Char('\n'));
    for (QString &line : lines)
        if (line.endsWith(QLatin1Char('\r')))
            line.chop(1);
    const bool anyTab = text.contains(QLatin1Char('\t'));
    const QChar separator = anyTab ? QLatin1Char('\t') : QLatin1Char(',');

    std::set<std::string> seen;
    bool first = true;
    int rowNumber = 0;
    for (const QString &line : lines) {
        ++rowNumber;
        if (line.trimmed().isEmpty())
            continue;
        const QStringList cells = line.split(separator);
        const QString asset = cells.value(0).trimmed().remove(QLatin1Char('"'));
        const QString quantityCell = cells.value(1).trimmed();
        const auto quantity = readNumber(quantityCell);
        if (first) {
            first = false;
            if (!quantity && cells.size() >= 2)
                continue; // a header row such as "asset<TAB>quantity"
        }
        if (asset.isEmpty()) {
            out.error = tr("Pasted row %1, column 1: the asset name is empty.").arg(rowNumber);
            return out;
        }
        const std::string name = asset.toStdString();
        if (prices.assetIndex(name) < 0) {
            out.error = tr("Pasted row %1, column 1: the price history has no asset named \"%2\".").arg(rowNumber).arg(asset);
            return out;
        }
        if (!seen.insert(name).second) {
            out.error = tr("Pasted row %1, column 1: %2 appears twice in the pasted block.").arg(rowNumber).arg(asset);
            return out;
        }
        if (!quantity) {
            out.error = cells.size() < 2
                            ? tr("Pasted row %1: expected an asset and a quantity separated by a tab.").arg(rowNumber)
                            : tr("Pasted row %1, column 2: \"%2\" is not a quantity.").arg(rowNumber).arg(quantityCell);
            return out;
        }
        std::optional<double> price;
        if (cells.size() >= 3 && !cells[2].trimmed().isEmpty()) {
            price = readNumber(cells[2]);
            if (!price || !(*price > 0.0)) {
                out.error = tr("Pasted row %1, column 3: a price must be a number greater than zero, found \"%2\".")
                                .arg(rowNumber).arg(cells[2].trimmed());
                return out;
            }
        }
        auto it = std::find_if(out.holdings.begin(), out.holdings.end(), [&](const Holding &h) { return h.asset == name; });
        if (it != out.holdings.end()) {
            it->quantity = *quantity;
            it->value.reset();
            if (price)
                it->priceOverride = price;
            ++out.updated;
        } else {
            Holding h;
            h.asset = name;
            h.quantity = *quantity;
            h.priceOverride = price;
            out.holdings.push_back(h);
            ++out.added;
        }
    }
    if (out.added + out.updated == 0)
        out.error = tr("The clipboard holds no rows of holdings (asset, a tab, then the quantity).");
    return out;
}

} // namespace tailwise::ui
