// One SHA-256 (sha256.h, FIPS 180-4) of everything a risk figure is computed from, so that a
// figure in a letter can be traced to exactly the inputs that produced it.
//
// The digest is taken over a canonical text of the inputs as read, not over the files, so that
// formatting that does not change the data does not change it:
//   - prices: the asset columns in byte order of their names (the file's column order does not
//     matter), one line per date "YYYY-MM-DD" then each price in the shortest decimal form that
//     reads back to the same double; line ends are "\n" whatever the file had;
//   - holdings: one line per holding in byte order of the asset name: asset, quantity, price
//     override and value ("-" when absent), in the same number form;
//   - assumptions: every field of Assumptions as "name=value", in a fixed order, so that a
//     changed confidence, horizon, model or seed changes the digest. A field added later with
//     a default is written only when it differs from that default ("scaling=aggregate"), so that
//     the digest of inputs made before it existed stays as it was.
// The prices hashed are the ones the figure used: after an as-of cut (asof.h) only the rows up to
// that date. Any changed price, holding or assumption changes the digest.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <string>

namespace tailwise {

// The canonical text described above (exposed for tests and for debugging a mismatch).
std::string canonicalInputText(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions);
// SHA-256 of canonicalInputText, 64 lower-case hexadecimal characters.
std::string inputSha256(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions);

// The canonical "name=value" lines of the assumptions alone.
std::string canonicalAssumptionsText(const Assumptions &assumptions);

} // namespace tailwise
