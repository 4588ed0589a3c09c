#include "savefile.h"

#include "tailwise/filewrite.h"

#include <QCoreApplication>
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

QString refusalToOverwriteInput(const QString &path, const QStringList &inputs)
{
    std::vector<std::string> raw;
    for (const QString &input : inputs)
        raw.push_back(QFile::encodeName(input).toStdString());
    const long i = tailwise::indexOfSameFile(QFile::encodeName(path).toStdString(), raw);
    if (i < 0)
        return {};
    return QCoreApplication::translate("SaveFile",
                                       "Writing to %1 would replace %2, a file this workbook was read from. Nothing was "
                                       "written: choose another file.")
        .arg(QDir::toNativeSeparators(path), QDir::toNativeSeparators(inputs[static_cast<qsizetype>(i)]));
}

} // namespace tailwise::ui
