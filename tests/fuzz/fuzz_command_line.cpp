// libFuzzer target: the command line's option parsing (app/cli: CommandLine over CLI11 and the
// option groups) on arbitrary arguments. The first byte picks the command (var or backtest); the
// rest is split into arguments at newlines. Parsing must end in a request or a usage error with a
// message, never crash, hang, leak or trip a sanitiser; and a request it accepts must hold
// assumptions the core accepts (validate), so that no value refused elsewhere slips through here.
#include "backtestoptions.h"
#include "varoptions.h"

#include "tailwise/assumptions.h"

#include <cstddef>
#include <cstdint>
#include <algorithm>
#include <cstdlib>
#include <string>
#include <string_view>
#include <vector>

namespace {

std::vector<std::string> splitArguments(std::string_view text)
{
    std::vector<std::string> args;
    std::size_t start = 0;
    while (start <= text.size() && args.size() < 64) {
        const std::size_t end = std::min(text.find('\n', start), text.size());
        args.emplace_back(text.substr(start, end - start));
        start = end + 1;
    }
    return args;
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    if (size == 0 || size > 4096)
        return 0;
    const bool backtest = (data[0] & 1) != 0;
    const auto args = splitArguments(std::string_view(reinterpret_cast<const char *>(data) + 1, size - 1));
    if (backtest) {
        const auto parsed = tailwise::cli::parseBacktestOptions(args);
        if (!parsed) {
            if (parsed.error().message.empty())
                std::abort();
            return 0;
        }
        if (!parsed.value().help && parsed.value().workbookPath.empty() && !tailwise::validate(parsed.value().assumptions))
            std::abort();
        return 0;
    }
    const auto parsed = tailwise::cli::parseVarOptions(args);
    if (!parsed) {
        if (parsed.error().message.empty())
            std::abort();
        return 0;
    }
    // Without --workbook the request is complete: its assumptions must be ones the core accepts.
    const auto &request = parsed.value();
    if (!request.help && request.workbookPath.empty() && !tailwise::validate(request.assumptions))
        std::abort();
    return 0;
}
