// libFuzzer target: the workbook loader (parseWorkbookJson) on arbitrary bytes. It must return
// contents or an Error, never crash, hang, leak or trip a sanitiser. Qt's own JSON parser is not
// instrumented (Debian's build); the fuzzer explores the checks around it.
#include "document/workbookfile.h"

#include <QByteArray>
#include <QString>

#include <cstddef>
#include <cstdint>
#include <cstdlib>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const QByteArray json = QByteArray::fromRawData(reinterpret_cast<const char *>(data), static_cast<qsizetype>(size));
    const auto result = tailwise::ui::parseWorkbookJson(json, QStringLiteral("fuzz.tailwise"));
    if (!result) {
        if (result.error().message.empty())
            std::abort();
        return 0;
    }
    // Contents it accepts can be stored again (the writer refuses only what the reader would).
    if (!tailwise::ui::workbookJson(result.value()))
        std::abort();
    return 0;
}
