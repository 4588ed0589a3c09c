// The workbook file: one analysis in one self-contained JSON file, extension `.tailwise`.
//
// Layout (format 1; JSON, UTF-8; keys are case-sensitive; unknown keys are ignored):
//   {
//     "kind": "tailwise-workbook",      what the file is: anything else is "not a workbook"
//     "format": 1,                      the layout version; a larger one is refused (newer program)
//     "title": "…",                     optional (empty when absent)
//     "prices": {                       the embedded daily price history
//       "assets": ["A", "B", …],        non-empty, unique names
//       "dates":  ["2024-01-02", …],    ISO dates, strictly increasing
//       "rows":   [[p_A, p_B, …], …]    one row per date, one finite price > 0 per asset
//     },                                (all three empty for a workbook with no data yet;
//                                        otherwise at least 3 dates, as for a price CSV)
//     "holdings": [                     in the order shown
//       {"asset": "A", "quantity": 100, "price": 12.5, "value": 1000}
//     ],                                quantity: units (negative = short), required unless
//                                       `value` is given; price: optional override of the last
//                                       close (> 0); value: optional money exposure, which
//                                       replaces quantity × price when present
//     "assumptions": {                  the fields of tailwise::Assumptions, named as the fields
//       "confidence": 0.99,             of validate() name them. confidence and horizon are
//                                       required (they say what the figure is); any other field
//                                       that is absent takes its default from Assumptions (a file
//                                       from before the field existed, or written by hand), and
//                                       the defaults used are listed in the contents' warnings:
//       "horizon": 10, "days-per-year": 252, "window": 500 | "all",
//       "returns": "simple" | "log", "estimator": "sample" | "ewma", "lambda": 0.94,
//       "mean": "zero" | "sample", "model": "normal" | "student-t" | …,
//       "dof": "unset" | "fit" | ν, "historical-horizon": "sqrt" | "overlapping",
//       "simulations": 100000, "seed": "1"  (a decimal string: JSON numbers cannot carry all
//                                            64 bits; a whole JSON number up to 2^53 is accepted)
//     },
//     "scenarios": [                    optional (absent in older files, and when there are none):
//       {"name": "…", "shocks": [       named stress scenarios (stress.h); names unique, not empty;
//         {"asset": "A", "shock": -0.2} a price-history asset, once per scenario; a fraction > −1
//       ]}
//     ]
//     "backtest": {                     optional (absent in older files; a program that predates it
//       "window": 250,                  ignores it, so the format stays 1): the window's backtest
//       "test-size": 0.05,              settings (BacktestSettings in workbookcontents.h): window
//       "models": ["normal", …]         ≥ 2 returns, 0 < test-size < 1, models a non-empty list of
//     }                                 distinct models the backtest runs, the first one drawn
//   }
// Rules for changing the layout (so that files travel between versions and machines):
//   - a new field is optional on load, with a stated default, and `format` stays the same: an
//     older program ignores it, an older file reads with the default;
//   - `format` goes up only when an older program would misread a file (a field changes meaning
//     or becomes required); a program refuses a file whose format is newer than its own, naming
//     both versions, and keeps reading every older format;
//   - numbers are JSON numbers (a '.' decimal point whatever the user's locale), dates ISO, text
//     UTF-8; the file holds no paths, so it opens unchanged on another machine.
// Numbers are written in the shortest form that reads back to the same double, so a save →
// load round trip is exact. A file is checked with the same rules as the CSV readers and the
// assumption checks (checkHoldings, validate), and a refusal names the file and the place in it
// as a JSON path with 0-based indices, e.g. "larchmere.tailwise: holdings[3].quantity: expected a
// number, found a string (\"ten\")"; malformed JSON names the line, column and byte offset.
//
// Saving is atomic (savefile.h: a temporary file beside the target, every write checked, then renamed over it),
// so a failed save leaves the previous file as it was. Contents that could not be read back
// (a non-finite price, a holding of an unknown asset, an assumption out of range) are refused
// before anything is written.
//
// QtCore only: the command line uses this without a display.
#pragma once

#include "workbookcontents.h"

#include "tailwise/result.h"

#include <QByteArray>
#include <QJsonObject>
#include <QString>

namespace tailwise::ui {

inline constexpr int workbookFormatVersion = 1;        // the layout this program writes and reads
inline constexpr const char *workbookKind = "tailwise-workbook";
inline constexpr const char *workbookSuffix = "tailwise"; // file name extension, without the dot
inline constexpr const char *workbookMimeType = "application/x-tailwise-workbook";

// Reads a workbook from JSON text; `sourceName` (a path, usually) starts every message and
// becomes the price history's sourceName.
tailwise::Result<WorkbookContents> parseWorkbookJson(const QByteArray &json, const QString &sourceName);
// Reads a workbook file: refuses a missing file, a folder, an unreadable or oversized file.
tailwise::Result<WorkbookContents> loadWorkbook(const QString &path);

// The JSON text of a workbook, or the reason the contents cannot be stored (see above).
// `extraKeys` are added at the top level, where readers ignore them (the recovery file's note of
// where it belongs, recoveryfile.h); the format's own keys always win over one of the same name.
tailwise::Result<QByteArray> workbookJson(const WorkbookContents &contents, const QJsonObject &extraKeys = {});
// Writes atomically; on failure the message names the path and the previous file is intact.
tailwise::Status saveWorkbook(const WorkbookContents &contents, const QString &path,
                              const QJsonObject &extraKeys = {});

} // namespace tailwise::ui
