// tailwise: the workbench window.
//   tailwise [WORKBOOK]                          opens the workbook (or starts empty, with a hint)
//   tailwise --prices CSV [--holdings CSV]       starts from a price history and holdings files
//   tailwise --screenshot PNG [WORKBOOK]         opens it, waits for the first figures, saves a
//                                                picture of the whole window (≥ 1280×800), exits
// Started for a person (not --screenshot), the window offers unsaved work that a session which
// did not close cleanly left in a recovery file (recoveryoffer.h).
#include "document/resultsstore.h"
#include "mainwindow.h"
#include "panels/holdingseditor.h"

#include <QApplication>
#include <QIcon>
#include <QCommandLineParser>
#include <QMessageBox>
#include <QPixmap>
#include <QTimer>

#include <algorithm>
#include <cstdio>

namespace {

void printProblem(const QString &problem)
{
    std::fprintf(stderr, "tailwise: %s\n", qPrintable(problem));
}

} // namespace

int main(int argc, char *argv[])
{
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Tailwise"));
    QApplication::setApplicationName(QStringLiteral("Tailwise"));
    QApplication::setWindowIcon(QIcon(QStringLiteral(":/icons/tailwise.svg")));
    QApplication::setApplicationVersion(QStringLiteral(TAILWISE_VERSION));

    QCommandLineParser parser;
    parser.setApplicationDescription(QApplication::translate("main", "Value-at-Risk and Expected Shortfall workbench."));
    parser.addHelpOption();
    parser.addVersionOption();
    const QCommandLineOption screenshot(QStringLiteral("screenshot"),
                                        QApplication::translate("main", "Save a picture of the window to FILE (PNG) and exit."),
                                        QStringLiteral("FILE"));
    const QCommandLineOption prices(QStringLiteral("prices"),
                                    QApplication::translate("main", "Start from this price history (CSV)."), QStringLiteral("CSV"));
    const QCommandLineOption holdings(QStringLiteral("holdings"),
                                      QApplication::translate("main", "Start with these holdings (CSV; needs --prices)."),
                                      QStringLiteral("CSV"));
    parser.addOptions({screenshot, prices, holdings});
    parser.addPositionalArgument(QStringLiteral("workbook"),
                                 QApplication::translate("main", "The workbook to open (.tailwise)."), QStringLiteral("[WORKBOOK]"));
    parser.process(app);
    const bool pictureOnly = parser.isSet(screenshot);

    tailwise::ui::MainWindow window;
    QStringList problems;
    if (!parser.positionalArguments().isEmpty()) {
        if (const QString p = window.openWorkbookFile(parser.positionalArguments().constFirst()); !p.isEmpty())
            problems << p;
    }
    if (parser.isSet(prices)) {
        if (const QString p = window.importPriceHistoryFile(parser.value(prices)); !p.isEmpty())
            problems << p;
    }
    if (parser.isSet(holdings)) {
        if (const QString p = window.holdingsEditor()->importHoldingsFile(parser.value(holdings)); !p.isEmpty())
            problems << p;
    }

    if (pictureOnly) {
        for (const QString &p : problems)
            printProblem(p);
        if (!problems.isEmpty())
            return 2;
        window.resize(std::max(1280, window.width()), std::max(800, window.height()));
        window.show();
        window.results().computeNow(tailwise::ui::Part::Headline);
        // Let layouts and charts settle on the first figures before taking the picture.
        for (int i = 0; i < 5; ++i)
            QApplication::processEvents();
        const QString file = parser.value(screenshot);
        if (!window.grab().save(file, "PNG")) {
            printProblem(QApplication::translate("main", "could not write the picture to %1").arg(file));
            return 1;
        }
        return 0;
    }

    window.show();
    // Work a session that did not close cleanly left behind is offered once the window is up.
    QTimer::singleShot(0, &window, [&window] { window.offerRecovery(); });
    if (!problems.isEmpty())
        QTimer::singleShot(0, &window, [&window, problems] {
            QMessageBox::warning(&window, QApplication::translate("main", "Could not open everything"),
                                 problems.join(QStringLiteral("\n\n")));
        });
    return QApplication::exec();
}
