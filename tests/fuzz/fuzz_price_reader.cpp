// libFuzzer target: the price history reader on arbitrary bytes. It must return a value or an
// Error, never crash, hang, leak or trip a sanitiser; a history it accepts must keep the reader's
// promises (prices.h): every price finite and > 0, dates strictly increasing, one row per date.
#include "tailwise/prices.h"

#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string_view text(reinterpret_cast<const char *>(data), size);
    const auto result = tailwise::parsePriceCsv(text, "fuzz.csv");
    if (!result) {
        if (result.error().message.empty())
            std::abort(); // every refusal must say why
        return 0;
    }
    const auto &h = result.value();
    if (h.assets.empty() || h.dates.size() < 3 || h.prices.rows() != static_cast<Eigen::Index>(h.dates.size())
        || h.prices.cols() != static_cast<Eigen::Index>(h.assets.size()))
        std::abort();
    if (!h.prices.allFinite() || (h.prices.array() <= 0.0).any())
        std::abort();
    for (std::size_t i = 1; i < h.dates.size(); ++i)
        if (!(h.dates[i - 1] < h.dates[i]))
            std::abort();
    // What the writer produces, the reader reads back to the same history.
    const auto again = tailwise::parsePriceCsv(tailwise::writePriceCsv(h), "fuzz-roundtrip.csv");
    if (!again || again.value().prices != h.prices || again.value().assets != h.assets)
        std::abort();
    return 0;
}
