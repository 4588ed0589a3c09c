// Holdings: what the portfolio holds, and each holding's money exposure.
//
// File format (CSV, same text rules as prices.h): a header naming the columns, in any order:
//   asset,quantity[,price]   quantity in units (negative = short); `price` overrides the last
//                            close of the price history for this holding's exposure
//   asset,value              money exposure given directly (negative = short)
// Errors (each names the file and line, and the column where it applies): an unknown header, a
// missing `asset` column, neither or both of `quantity` and `value`, a non-number, a non-positive
// price override, an asset the price history lacks, an asset listed twice.
//
// Exposure (money): e_i = quantity_i × price_i, price_i = override or the last close P_T,i;
// or e_i = value_i when the holding is given by value. Portfolio value V = Σ e_i.
#pragma once

#include "tailwise/prices.h"
#include "tailwise/result.h"

#include <Eigen/Core>

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace tailwise {

struct Holding {
    std::string asset;
    double quantity = 0.0;               // units; used unless `value` is set
    std::optional<double> priceOverride; // replaces the last close
    std::optional<double> value;         // money exposure given directly
};

using Holdings = std::vector<Holding>;

// Parses holdings CSV and checks every asset against `prices` (pass nullptr to skip that check).
Result<Holdings> parseHoldingsCsv(std::string_view text, const std::string &sourceName,
                                  const PriceHistory *prices);
Result<Holdings> readHoldingsCsv(const std::string &path, const PriceHistory *prices);
std::string writeHoldingsCsv(const Holdings &holdings);

// The price a holding is valued at: the override, else the last close. Asset must exist.
double holdingPrice(const Holding &holding, const PriceHistory &prices);
// Money exposure of one holding (see the header comment).
double holdingExposure(const Holding &holding, const PriceHistory &prices);

// Checks that every holding names an asset of `prices`, once; the error names the holding row
// (1-based, as a user counts them) and the asset.
Status checkHoldings(const Holdings &holdings, const PriceHistory &prices);

} // namespace tailwise
