// libFuzzer target: the holdings reader on arbitrary bytes, both without a price history (no
// asset check) and against a small fixed one (assets A, B, C). It must return a value or an Error,
// never crash, hang, leak or trip a sanitiser; accepted holdings must be finite and, with the
// history, name known assets once each (holdings.h).
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

namespace {

const tailwise::PriceHistory &history()
{
    static const tailwise::PriceHistory h = [] {
        auto r = tailwise::parsePriceCsv("date,A,B,C\n2024-01-02,10,20,30\n2024-01-03,11,19,31\n2024-01-04,12,21,29\n",
                                         "fuzz-prices.csv");
        if (!r)
            std::abort();
        return r.value();
    }();
    return h;
}

void checkAccepted(const tailwise::Holdings &holdings, const tailwise::PriceHistory *prices)
{
    if (holdings.empty())
        std::abort();
    for (const auto &h : holdings) {
        if (h.asset.empty() || !std::isfinite(h.quantity) || (h.value && !std::isfinite(*h.value))
            || (h.priceOverride && !(std::isfinite(*h.priceOverride) && *h.priceOverride > 0.0)))
            std::abort();
        if (prices && !std::isfinite(tailwise::holdingExposure(h, *prices)))
            std::abort();
    }
    if (prices && !tailwise::checkHoldings(holdings, *prices))
        std::abort();
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string_view text(reinterpret_cast<const char *>(data), size);
    for (const tailwise::PriceHistory *prices : {static_cast<const tailwise::PriceHistory *>(nullptr), &history()}) {
        const auto result = tailwise::parseHoldingsCsv(text, "fuzz-holdings.csv", prices);
        if (!result) {
            if (result.error().message.empty())
                std::abort();
            continue;
        }
        checkAccepted(result.value(), prices);
    }
    return 0;
}
