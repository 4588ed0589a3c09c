#include "savefile.h"

#include "tailwise/filewrite.h"

#include <QDir>
#include <QFile>

namespace tailwise::ui {

tailwise::Status saveFile(const QString &path, const QByteArray &bytes)
{
    // File names are bytes on Linux; encodeName gives those QFile would open.
    auto status = tailwise::writeFileReplacing(QFile::encodeName(path).toStdString(),
                                               std::string_view(bytes.constData(), static_cast<std::size_t>(bytes.size())));
    if (!status) {
        // Say the name as the user sees it (native separators, decoded), not as bytes.
        tailwise::Error e = status.error();
        const std::string raw = QFile::encodeName(path).toStdString();
        const std::string shown = QDir::toNativeSeparators(path).toStdString();
        if (raw != shown && e.message.rfind("could not save " + raw, 0) == 0)
            e.message = "could not save " + shown + e.message.substr(15 + raw.size());
        e.file = shown;
        return e;
    }
    return Done{};
}

} // namespace tailwise::ui
