// Shared set-up for the window tests: a main window loaded with the invented sample fund
// (samples/prices.csv, samples/holdings.csv), figures computed.
#pragma once

#include "document/resultsstore.h"
#include "document/workbook.h"
#include "mainwindow.h"
#include "panels/holdingseditor.h"

#include <QCoreApplication>
#include <QTest>

#include <memory>

namespace tailwise::ui::test {

inline QString samplePath(const char *name)
{
    return QStringLiteral(TAILWISE_SOURCE_DIR "/samples/") + QLatin1String(name);
}

// Settings of the tests stay apart from a user's own.
inline void isolateSettings()
{
    QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
    QCoreApplication::setApplicationName(QStringLiteral("TailwiseWindowTests"));
}

inline std::unique_ptr<MainWindow> sampleWindow()
{
    auto window = std::make_unique<MainWindow>();
    const QString pricesProblem = window->importPriceHistoryFile(samplePath("prices.csv"));
    const QString holdingsProblem = window->holdingsEditor()->importHoldingsFile(samplePath("holdings.csv"));
    if (!pricesProblem.isEmpty() || !holdingsProblem.isEmpty())
        qFatal("sample fund did not load: %s %s", qPrintable(pricesProblem), qPrintable(holdingsProblem));
    window->results().computeNow(Part::Headline);
    return window;
}

} // namespace tailwise::ui::test
