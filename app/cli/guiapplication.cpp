#include "guiapplication.h"

#include <QApplication>
#include <QLocale>

#include <memory>

namespace tailwise::cli {

std::unique_ptr<QApplication> makeGuiApplication()
{
    // QApplication keeps references to argc and argv for its lifetime: both are static.
    static int argc = 1;
    static char name[] = "tailwise-cli";
    static char *argv[] = {name, nullptr};
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    auto app = std::make_unique<QApplication>(argc, argv);
    if (QLocale().language() == QLocale::C) {
        QLocale c = QLocale::c();
        c.setNumberOptions(c.numberOptions() & ~QLocale::OmitGroupSeparator);
        QLocale::setDefault(c);
    }
    return app;
}

} // namespace tailwise::cli
