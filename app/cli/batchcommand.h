// `tailwise-cli batch WORKBOOK… | --list FILE [--as-of DATE] [--record FILE.db]
//  [--out results.csv|results.jsonl] [-j N] [--limit SPEC]… [--fail-on-breach]`:
// many workbooks, each with its stored assumptions and limits, computed in parallel and reported
// one line per workbook in input order. A workbook that fails is reported on its line with its
// message and the others go on; the exit status says whether any failed.
#pragma once

#include "tailwise/result.h"

#include <string>
#include <vector>

namespace tailwise::cli {

int runBatchCommand(const std::vector<std::string> &args);
std::string batchHelpText();

// The workbooks a --list file names: one path per line; blank lines and lines starting with #
// are skipped; surrounding spaces and a CR before the line end are dropped.
Result<std::vector<std::string>> readBatchList(const std::string &path);

} // namespace tailwise::cli
