#include "guiapplication.h"

#include <QApplication>
#include <QByteArray>
#include <QDir>
#include <QFile>
#include <QLocale>

#include <cerrno>
#include <memory>

#include <sys/stat.h>
#include <unistd.h>

namespace tailwise::cli {

namespace {

// Qt wants a runtime folder (XDG Base Directory Specification: private, mode 0700, owned by
// the user) and, finding none, prints a warning on stderr each time it looks — which a user's
// script would read as our output. So when the session gives none (root in a container, cron),
// we make one of our own in the temporary folder before the application exists.
void ensureRuntimeFolder()
{
    if (qEnvironmentVariableIsSet("XDG_RUNTIME_DIR")) {
        return;
    }
    const QString path = QDir::tempPath() + QStringLiteral("/tailwise-runtime-%1").arg(::getuid());
    const QByteArray native = QFile::encodeName(path);
    if (::mkdir(native.constData(), 0700) != 0 && errno != EEXIST)
        return; // Qt will then say what it says; our drawing does not depend on the folder
    struct stat st {};
    // Use it only if it is ours and private: another user could have made it first.
    if (::lstat(native.constData(), &st) != 0 || !S_ISDIR(st.st_mode) || st.st_uid != ::getuid())
        return;
    if ((st.st_mode & 0777) != 0700 && ::chmod(native.constData(), 0700) != 0)
        return;
    qputenv("XDG_RUNTIME_DIR", native);
}

} // namespace

std::unique_ptr<QApplication> makeGuiApplication()
{
    // QApplication keeps references to argc and argv for its lifetime: both are static.
    static int argc = 1;
    static char name[] = "tailwise-cli";
    static char *argv[] = {name, nullptr};
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    ensureRuntimeFolder();
    auto app = std::make_unique<QApplication>(argc, argv);
    if (QLocale().language() == QLocale::C) {
        QLocale c = QLocale::c();
        c.setNumberOptions(c.numberOptions() & ~QLocale::OmitGroupSeparator);
        QLocale::setDefault(c);
    }
    return app;
}

} // namespace tailwise::cli
