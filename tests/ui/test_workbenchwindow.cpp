// The workbench window driven as a user drives it, offscreen: edits through the real widgets go
// to the workbook as undo steps, and the figures shown are the ones core computes for the new
// inputs (checked against tailwise::computeRisk called directly on the same inputs).
#include "windowfixture.h"

#include "actions.h"
#include "charts/losstailchart.h"
#include "document/commands.h"
#include "document/workbookfile.h"
#include "models/holdingsmodel.h"
#include "panels/charttabs.h"
#include "panels/holdingspaste.h"
#include "text/names.h"
#include "text/numbers.h"

#include "tailwise/risk.h"

#include <QAbstractItemModelTester>
#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QDoubleSpinBox>
#include <QFile>
#include <QLabel>
#include <QLineEdit>
#include <QProcess>
#include <QSignalSpy>
#include <QSlider>
#include <QSortFilterProxyModel>
#include <QTableView>
#include <QTemporaryDir>
#include <QUndoStack>

#include <algorithm>
#include <cmath>

using namespace tailwise;
using namespace tailwise::ui;
using namespace tailwise::ui::test;

namespace {

// Figures are compared to core's within a relative 1e-12: the window must show core's number,
// not a recomputation of its own (common practice for "same computation" comparisons).
constexpr double kRelTol = 1e-12;

bool close(double actual, double expected)
{
    return std::abs(actual - expected) <= kRelTol * std::max(1.0, std::abs(expected));
}

QString describe(double actual, double expected)
{
    return QStringLiteral("actual %1, expected %2, relative tolerance %3")
        .arg(actual, 0, 'g', 17).arg(expected, 0, 'g', 17).arg(kRelTol);
}

double coreVar(const Workbook &wb, const Holdings &holdings, const Assumptions &assumptions)
{
    auto r = computeRisk(wb.prices(), holdings, assumptions);
    if (!r)
        qFatal("core refused the inputs: %s", r.error().message.c_str());
    return r.value().figures.var;
}

QString headlineVar(const MainWindow &w)
{
    return w.findChild<QLabel *>(QStringLiteral("varMoney"))->text();
}

// Types `text` into the cell as a user would: select it, start editing, type, press Return.
void typeIntoCell(QTableView *view, const QModelIndex &index, const QString &text)
{
    view->setCurrentIndex(index);
    view->edit(index);
    auto *editor = qobject_cast<QLineEdit *>(view->indexWidget(index));
    QVERIFY2(editor, "no line editor opened on the cell");
    editor->selectAll();
    QTest::keyClicks(editor, text);
    QTest::keyClick(editor, Qt::Key_Return);
    // The delegate commits and closes its editor on the next event-loop turn.
    QTRY_VERIFY(!view->indexWidget(index));
}

QModelIndex viewIndex(const MainWindow &w, int sourceRow, int column)
{
    auto *proxy = qobject_cast<QSortFilterProxyModel *>(w.holdingsEditor()->tableView()->model());
    return proxy->mapFromSource(w.holdingsEditor()->model()->index(sourceRow, column));
}

} // namespace

class TestWorkbenchWindow : public QObject {
    Q_OBJECT
private slots:
    void initTestCase()
    {
        isolateSettings();
        QLocale::setDefault(QLocale(QLocale::English, QLocale::UnitedKingdom));
    }

    void editingQuantityChangesHeadlineAndUndoRestoresIt()
    {
        auto w = sampleWindow();
        w->show();
        QVERIFY(QTest::qWaitForWindowExposed(w.get()));
        Workbook &wb = w->workbook();
        const double before = coreVar(wb, wb.holdings(), wb.assumptions());
        QVERIFY2(close(wb.results().report()->figures.var, before), qPrintable(describe(wb.results().report()->figures.var, before)));
        QCOMPARE(headlineVar(*w), moneyText(before));

        // Row 0 of the sample holds 9,000 LARK_ENERGY; the user types 20000.
        Holdings edited = wb.holdings();
        edited[0].quantity = 20000;
        const double after = coreVar(wb, edited, wb.assumptions());
        QVERIFY(!close(after, before));
        typeIntoCell(w->holdingsEditor()->tableView(), viewIndex(*w, 0, HoldingsModel::QuantityColumn),
                     QStringLiteral("20000"));
        QCOMPARE(wb.holdings()[0].quantity, 20000.0);
        QTRY_COMPARE(headlineVar(*w), moneyText(after));
        QVERIFY2(close(wb.results().report()->figures.var, after), qPrintable(describe(wb.results().report()->figures.var, after)));
        QCOMPARE(wb.undoStack()->undoText(), QStringLiteral("Change quantity of LARK_ENERGY to 20,000"));
        QVERIFY(w->isWindowModified());

        // Edit ▸ Undo, as the menu runs it.
        w->actions().get(Actions::Undo)->trigger();
        QCOMPARE(wb.holdings()[0].quantity, 9000.0);
        QTRY_COMPARE(headlineVar(*w), moneyText(before));
        QVERIFY2(close(wb.results().report()->figures.var, before), qPrintable(describe(wb.results().report()->figures.var, before)));
    }

    void changingConfidenceUpdatesFiguresAndChart()
    {
        auto w = sampleWindow();
        w->show();
        QVERIFY(QTest::qWaitForWindowExposed(w.get()));
        Workbook &wb = w->workbook();
        auto *spin = w->findChild<QDoubleSpinBox *>(QStringLiteral("confidence"));
        QVERIFY(spin);
        QCOMPARE(spin->value(), 99.0);
        spin->setFocus();
        spin->selectAll();
        QTest::keyClicks(spin, QStringLiteral("97.5"));
        QTest::keyClick(spin, Qt::Key_Return);
        QTRY_VERIFY(wb.results().report() && std::abs(wb.results().report()->assumptions.confidence - 0.975) < 1e-12);
        Assumptions a = wb.assumptions();
        const double expected = coreVar(wb, wb.holdings(), a);
        QVERIFY2(close(wb.results().report()->figures.var, expected), qPrintable(describe(wb.results().report()->figures.var, expected)));
        QCOMPARE(headlineVar(*w), moneyText(expected));
        // The loss-tail chart's shaded boundary follows to exactly −VaR.
        const auto &chart = w->chartTabs()->lossTailChart()->data();
        QCOMPARE(chart.tailBoundary, -wb.results().report()->figures.var);
        QCOMPARE(chart.confidence, 0.975);
    }

    // The sample fund imported from its CSV files states no currency: the field at the top of the
    // assumptions pane is empty and the loss-tail chart's money axis says "money". A text that is
    // not a code is refused with the reason and changes nothing; a good one is one undo step that
    // the axis and the headline follow, and undo brings "money" back.
    void currencyEditIsOneUndoStepAndNamesTheAxis()
    {
        auto w = sampleWindow();
        w->show();
        QVERIFY(QTest::qWaitForWindowExposed(w.get()));
        Workbook &wb = w->workbook();
        auto *field = w->findChild<QLineEdit *>(QStringLiteral("workbookCurrency"));
        QVERIFY(field);
        QCOMPARE(field->text(), QString());
        QCOMPARE(wb.currency(), QString());
        const auto axis = [&] { return w->chartTabs()->lossTailChart()->data().xLabel; };
        QTRY_VERIFY2(axis().contains(QStringLiteral("(money;")), qPrintable(axis()));
        const int steps = wb.undoStack()->count();

        field->setFocus();
        field->selectAll();
        QTest::keyClicks(field, QStringLiteral("dollars"));
        QTest::keyClick(field, Qt::Key_Return);
        QCOMPARE(wb.currency(), QString());
        QCOMPARE(wb.undoStack()->count(), steps);
        bool told = false;
        for (QLabel *label : field->parentWidget()->findChildren<QLabel *>())
            told = told || (label->isVisible() && label->text().contains(QStringLiteral("three capital letters")));
        QVERIFY2(told, "the refusal says what a code is");

        field->selectAll();
        QTest::keyClicks(field, QStringLiteral("EUR"));
        QTest::keyClick(field, Qt::Key_Return);
        QCOMPARE(wb.currency(), QStringLiteral("EUR"));
        QCOMPARE(wb.undoStack()->count(), steps + 1);
        QCOMPARE(wb.undoStack()->undoText(), QStringLiteral("Set currency"));
        QTRY_VERIFY2(axis().contains(QStringLiteral("(EUR;")), qPrintable(axis()));
        auto *beside = w->findChild<QLabel *>(QStringLiteral("headlineCurrency"));
        QVERIFY(beside);
        QCOMPARE(beside->text(), QStringLiteral("EUR")); // beside the portfolio value in the headline

        w->actions().get(Actions::Undo)->trigger();
        QCOMPARE(wb.currency(), QString());
        QCOMPARE(field->text(), QString());
        QCOMPARE(beside->text(), QString());
        QTRY_VERIFY2(axis().contains(QStringLiteral("(money;")), qPrintable(axis()));

        // The title beside it: one undo step too, shown in the headline.
        auto *title = w->findChild<QLineEdit *>(QStringLiteral("workbookTitleEdit"));
        QVERIFY(title);
        title->setFocus();
        title->selectAll();
        QTest::keyClicks(title, QStringLiteral("Larchmere Balanced Fund"));
        QTest::keyClick(title, Qt::Key_Return);
        QCOMPARE(wb.title(), QStringLiteral("Larchmere Balanced Fund"));
        QCOMPARE(wb.undoStack()->undoText(), QStringLiteral("Rename workbook"));
        w->actions().get(Actions::Undo)->trigger();
        QCOMPARE(wb.title(), QString());
        QCOMPARE(title->text(), QString());
    }

    void sliderDragIsOneUndoStep()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        auto *slider = w->findChild<QSlider *>(QStringLiteral("confidenceSlider"));
        QVERIFY(slider);
        QCOMPARE(slider->value(), 990);
        const int steps = wb.undoStack()->count();

        // A drag: press, move through many values, release.
        slider->setSliderDown(true);
        for (int v = 989; v >= 950; --v)
            slider->setValue(v);
        slider->setSliderDown(false);
        QCOMPARE(wb.undoStack()->count(), steps + 1);
        QCOMPARE(wb.assumptions().confidence, 0.95);
        auto *spin = w->findChild<QDoubleSpinBox *>(QStringLiteral("confidence"));
        QCOMPARE(spin->value(), 95.0); // the pane follows without echoing an edit
        QCOMPARE(wb.undoStack()->count(), steps + 1);

        // A second, later drag is a step of its own.
        slider->setSliderDown(true);
        for (int v = 951; v <= 975; ++v)
            slider->setValue(v);
        slider->setSliderDown(false);
        QCOMPARE(wb.undoStack()->count(), steps + 2);

        wb.undoStack()->undo();
        QCOMPARE(wb.assumptions().confidence, 0.95);
        wb.undoStack()->undo();
        QCOMPARE(wb.assumptions().confidence, 0.99);
        QCOMPARE(slider->value(), 990);
        w->results().computeNow(Part::Headline);
        QVERIFY2(close(wb.results().report()->figures.var, coreVar(wb, wb.holdings(), wb.assumptions())), "figures after undo");
    }

    void refusedCellKeepsOldValueAndSaysWhy()
    {
        auto w = sampleWindow();
        w->show();
        QVERIFY(QTest::qWaitForWindowExposed(w.get()));
        Workbook &wb = w->workbook();
        HoldingsModel *model = w->holdingsEditor()->model();
        QSignalSpy refused(model, &HoldingsModel::editRefused);
        QSignalSpy status(w->holdingsEditor(), &HoldingsEditor::statusMessage);
        const Holdings before = wb.holdings();
        const int steps = wb.undoStack()->count();

        typeIntoCell(w->holdingsEditor()->tableView(), viewIndex(*w, 2, HoldingsModel::QuantityColumn),
                     QStringLiteral("lots"));
        QCOMPARE(refused.count(), 1);
        const QString reason = refused.at(0).at(1).toString();
        QVERIFY2(reason.contains(QStringLiteral("Row 3")) && reason.contains(QStringLiteral("\"lots\" is not a number")),
                 qPrintable(reason));
        QCOMPARE(status.last().at(0).toString(), reason);
        QCOMPARE(wb.holdings()[2].quantity, before[2].quantity);
        QCOMPARE(model->index(2, HoldingsModel::QuantityColumn).data().toString(), QStringLiteral("14,000"));

        // An unknown asset, an asset held in another row, a price of zero: each refused, named.
        QVERIFY(!model->setData(model->index(0, HoldingsModel::AssetColumn), QStringLiteral("NO_SUCH_FUND")));
        QVERIFY(refused.last().at(1).toString().contains(QStringLiteral("no asset named \"NO_SUCH_FUND\"")));
        QVERIFY(!model->setData(model->index(0, HoldingsModel::AssetColumn), QStringLiteral("ORRIN_BANK")));
        QVERIFY(refused.last().at(1).toString().contains(QStringLiteral("already held in row 3")));
        QVERIFY(!model->setData(model->index(0, HoldingsModel::PriceColumn), QStringLiteral("0")));
        QVERIFY(refused.last().at(1).toString().contains(QStringLiteral("greater than zero")));
        QCOMPARE(refused.count(), 4);
        QCOMPARE(wb.undoStack()->count(), steps);
        QCOMPARE(wb.holdings().size(), before.size());
        for (std::size_t i = 0; i < before.size(); ++i) {
            QCOMPARE(wb.holdings()[i].asset, before[i].asset);
            QCOMPARE(wb.holdings()[i].quantity, before[i].quantity);
            QCOMPARE(wb.holdings()[i].priceOverride.has_value(), before[i].priceOverride.has_value());
        }
    }

    void badPriceImportReportsPlaceAndChangesNothing()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        const auto assets = wb.prices().assets;
        const int days = wb.prices().dayCount();
        const std::size_t holdings = wb.holdings().size();
        const int steps = wb.undoStack()->count();
        const double var = wb.results().report()->figures.var;

        QTemporaryDir dir;
        const QString bad = dir.filePath(QStringLiteral("bad-prices.csv"));
        {
            QFile f(bad);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("date,LARK_ENERGY,ORRIN_BANK\n2024-01-02,10,20\n2024-01-03,10.5,20.1\n2024-01-04,10.4,abc\n");
        }
        const QString problem = w->importPriceHistoryFile(bad);
        QVERIFY2(problem.contains(QStringLiteral("line 4")) && problem.contains(QStringLiteral("column 3")),
                 qPrintable(problem));
        QVERIFY2(problem.contains(QStringLiteral("bad-prices.csv")), qPrintable(problem));

        // A readable history that lacks held assets is refused too, naming them.
        const QString partial = dir.filePath(QStringLiteral("partial.csv"));
        {
            QFile f(partial);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("date,LARK_ENERGY,ORRIN_BANK\n2024-01-02,10,20\n2024-01-03,10.5,20.1\n2024-01-04,10.4,20.3\n");
        }
        const QString missing = w->importPriceHistoryFile(partial);
        QVERIFY2(missing.contains(QStringLiteral("FENWAY_RAIL")) && missing.contains(QStringLiteral("BROAD_MARKET_FUTURE"))
                     && !missing.contains(QStringLiteral("LARK_ENERGY")),
                 qPrintable(missing));

        QCOMPARE(wb.prices().assets, assets);
        QCOMPARE(wb.prices().dayCount(), days);
        QCOMPARE(wb.holdings().size(), holdings);
        QCOMPARE(wb.undoStack()->count(), steps);
        w->results().computeNow(Part::Headline);
        QCOMPARE(wb.results().report()->figures.var, var);
    }

    // A name at the file's limit (100 characters, tailwise/textlimits.h) must not push the
    // holdings column, the window or the contributions chart apart: the column is capped and
    // elides in the middle, the tooltip gives the whole name, the chart's axis a shortened one.
    void longNamesAreElided()
    {
        const QString longName = QStringLiteral("HARBOUR_") + QString(84, QLatin1Char('X')) + QStringLiteral("_CLASS_B");
        QCOMPARE(longName.size(), 100);
        QTemporaryDir dir;
        const QString prices = dir.filePath(QStringLiteral("prices.csv"));
        const QString holdings = dir.filePath(QStringLiteral("holdings.csv"));
        {
            QFile f(prices);
            QVERIFY(f.open(QIODevice::WriteOnly));
            QByteArray text = "date," + longName.toUtf8() + ",SHORT\n";
            double a = 100.0, b = 50.0;
            for (int d = 0; d < 80; ++d) {
                a *= 1.0 + 0.01 * std::sin(d * 1.3);
                b *= 1.0 + 0.008 * std::cos(d * 0.7);
                text += QStringLiteral("2024-%1-%2,%3,%4\n")
                            .arg(1 + d / 28, 2, 10, QLatin1Char('0')).arg(1 + d % 28, 2, 10, QLatin1Char('0'))
                            .arg(a, 0, 'f', 6).arg(b, 0, 'f', 6).toUtf8();
            }
            f.write(text);
        }
        {
            QFile f(holdings);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("asset,quantity\n" + longName.toUtf8() + ",1000\nSHORT,2000\n");
        }
        MainWindow w;
        w.resize(1360, 860);
        QVERIFY(w.importPriceHistoryFile(prices).isEmpty());
        QVERIFY(w.holdingsEditor()->importHoldingsFile(holdings).isEmpty());
        // A title at its limit of 200 characters (a one-line label in the headline) too.
        const QString longTitle = QString(200, QLatin1Char('T'));
        edit::setTitle(w.workbook(), longTitle);
        w.results().computeNow(Part::Headline);
        w.show();
        QVERIFY(QTest::qWaitForWindowExposed(&w));
        QCoreApplication::processEvents();

        auto *view = w.holdingsEditor()->findChild<QTableView *>();
        QVERIFY(view);
        const int cap = view->fontMetrics().averageCharWidth() * (shortNameChars + 2) + 16;
        QVERIFY2(view->columnWidth(HoldingsModel::AssetColumn) <= cap,
                 qPrintable(QStringLiteral("asset column %1 px, cap %2 px").arg(view->columnWidth(HoldingsModel::AssetColumn)).arg(cap)));
        QCOMPARE(view->textElideMode(), Qt::ElideMiddle);
        const QModelIndex cell = view->model()->index(0, HoldingsModel::AssetColumn);
        QCOMPARE(cell.data(Qt::ToolTipRole).toString(), longName);
        auto *titleLabel = w.findChild<QLabel *>(QStringLiteral("workbookTitle"));
        QVERIFY(titleLabel);
        QVERIFY2(titleLabel->text().size() < longTitle.size() && titleLabel->toolTip() == longTitle,
                 qPrintable(titleLabel->text()));
        // No wider than the same window holding the sample's short names; and that window fits
        // a 1366-pixel-wide laptop screen (a common size, from memory).
        {
            auto small = sampleWindow();
            QVERIFY2(small->minimumSizeHint().width() <= 1366, qPrintable(QString::number(small->minimumSizeHint().width())));
        }
        auto sample = sampleWindow();
        sample->resize(1360, 860);
        sample->show();
        QVERIFY(QTest::qWaitForWindowExposed(sample.get()));
        QVERIFY2(w.width() <= sample->width() && w.minimumSizeHint().width() <= sample->minimumSizeHint().width(),
                 qPrintable(QStringLiteral("%1 px wide (minimum %2), the sample's window %3 (minimum %4)")
                                .arg(w.width()).arg(w.minimumSizeHint().width())
                                .arg(sample->width()).arg(sample->minimumSizeHint().width())));

        const QString shown = shortName(longName);
        QCOMPARE(shown.size(), shortNameChars);
        QVERIFY(shown.startsWith(QStringLiteral("HARBOUR_")) && shown.endsWith(QStringLiteral("_CLASS_B")));
        QVERIFY(shown.contains(QChar(0x2026)));
        QCOMPARE(shortName(QStringLiteral("SHORT")), QStringLiteral("SHORT"));
        // Characters, not UTF-16 units: a name of 40 emoji keeps whole pairs.
        QString wide;
        for (int i = 0; i < 40; ++i)
            wide += QString::fromUcs4(U"\U0001F4C8", 1);
        const QString wideShort = shortName(wide);
        QCOMPARE(wideShort.toUcs4().size(), qsizetype(shortNameChars));
        QVERIFY(!wideShort.isEmpty() && !wideShort.back().isHighSurrogate());
    }

    // Every table of the window offers "Export Table…"; the holdings go to .xlsx with figures as
    // numbers in money and percent formats (read back with openpyxl, Debian's python3-openpyxl)
    // and to CSV; a file the workbook was read from is refused.
    void tablesExportWithFiguresAsNumbers()
    {
        auto w = sampleWindow();
        for (QTableView *view : w->findChildren<QTableView *>()) {
            const auto actions = view->actions();
            QVERIFY2(std::any_of(actions.begin(), actions.end(),
                                 [](const QAction *a) { return a->text().startsWith(QStringLiteral("Export Table")); }),
                     qPrintable(view->objectName()));
        }
        auto *view = w->holdingsEditor()->tableView();
        QTemporaryDir dir;
        const QString xlsx = dir.filePath(QStringLiteral("holdings.xlsx"));
        const QString csv = dir.filePath(QStringLiteral("holdings.csv"));
        QVERIFY(w->exportTableFile(view, xlsx).isEmpty());
        QVERIFY(w->exportTableFile(view, csv).isEmpty());
        QVERIFY(w->exportTableFile(view, dir.filePath(QStringLiteral("holdings.txt"))).contains(QStringLiteral(".txt")));
        QVERIFY(w->exportTableFile(view, samplePath("prices.csv")).contains(QStringLiteral("would replace")));

        // The first holding's market value as the model holds it, rounded as shown (whole units).
        const QAbstractItemModel *model = view->model();
        int valueColumn = -1;
        for (int c = 0; c < model->columnCount(); ++c)
            if (model->headerData(c, Qt::Horizontal).toString() == QStringLiteral("Market value"))
                valueColumn = c;
        QVERIFY(valueColumn >= 0);
        const auto shownValue = readNumber(model->index(0, valueColumn).data().toString());
        QVERIFY(shownValue);
        QFile f(csv);
        QVERIFY(f.open(QIODevice::ReadOnly));
        const QStringList lines = QString::fromUtf8(f.readAll()).split(QLatin1Char('\n'), Qt::SkipEmptyParts);
        QCOMPARE(lines.size(), model->rowCount() + 1);
        QVERIFY2(lines[0].contains(QStringLiteral("Market value")), qPrintable(lines[0]));

        QProcess python;
        python.start(QStringLiteral("/usr/bin/python3"),
                     {QStringLiteral("-c"),
                      QStringLiteral("import sys, openpyxl\n"
                                     "ws = openpyxl.load_workbook(sys.argv[1]).active\n"
                                     "c = ws.cell(row=2, column=int(sys.argv[2]) + 1)\n"
                                     "print(type(c.value).__name__, repr(c.value), c.number_format, ws.freeze_panes)\n"),
                      xlsx, QString::number(valueColumn)});
        QVERIFY(python.waitForFinished(60000));
        const QString out = QString::fromUtf8(python.readAllStandardOutput()).trimmed();
        if (python.exitCode() != 0 && python.readAllStandardError().contains("No module named 'openpyxl'"))
            QSKIP("python3-openpyxl is not installed: the .xlsx is not read back");
        const QStringList parts = out.split(QLatin1Char(' '));
        QVERIFY2(parts.size() >= 4 && (parts[0] == QStringLiteral("float") || parts[0] == QStringLiteral("int")),
                 qPrintable(out)); // a number, not text
        QCOMPARE(parts[1].toDouble(), *shownValue);
        QVERIFY2(parts[2].contains(QStringLiteral("#,##0")), qPrintable(out));
        QCOMPARE(parts[3], QStringLiteral("A2"));
    }

    void pasteIsOneUndoStep()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        const int steps = wb.undoStack()->count();
        const std::size_t count = wb.holdings().size();
        // From a spreadsheet: a header row, one held asset updated, and a malformed row refused.
        QVERIFY(!w->holdingsEditor()->pasteText(QStringLiteral("asset\tquantity\nLARK_ENERGY\t1x\n")).isEmpty());
        QCOMPARE(wb.undoStack()->count(), steps);
        const QString problem = w->holdingsEditor()->pasteText(QStringLiteral("Asset\tQuantity\r\nLARK_ENERGY\t1,500\r\nORRIN_BANK\t-200\r\n"));
        QVERIFY2(problem.isEmpty(), qPrintable(problem));
        QCOMPARE(wb.undoStack()->count(), steps + 1);
        QCOMPARE(wb.holdings().size(), count);
        QCOMPARE(wb.holdings()[0].quantity, 1500.0);
        QCOMPARE(wb.holdings()[2].quantity, -200.0);
        wb.undoStack()->undo();
        QCOMPARE(wb.holdings()[0].quantity, 9000.0);
        QCOMPARE(wb.holdings()[2].quantity, 14000.0);
    }

    void rowCommandsAddDuplicateRemove()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        // Every asset of the sample is held: adding says so and changes nothing.
        QVERIFY(w->holdingsEditor()->addHolding().contains(QStringLiteral("already held")));
        w->holdingsEditor()->tableView()->selectRow(viewIndex(*w, 12, 0).row());
        QVERIFY(w->holdingsEditor()->removeSelected().isEmpty());
        QCOMPARE(wb.holdings().size(), std::size_t(12));
        QVERIFY(w->holdingsEditor()->addHolding().isEmpty());
        QCOMPARE(wb.holdings().back().asset, std::string("BROAD_MARKET_FUTURE"));
        QCOMPARE(wb.holdings().back().quantity, 0.0);
        wb.undoStack()->undo();
        wb.undoStack()->undo();
        QCOMPARE(wb.holdings().size(), std::size_t(13));
        QCOMPARE(wb.holdings().back().quantity, -120.0);
    }

    void openingABadWorkbookKeepsTheOpenOne()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        QTemporaryDir dir;
        const QString good = dir.filePath(QStringLiteral("fund.tailwise"));
        QVERIFY(wb.isModified()); // the imports are unsaved edits
        QCOMPARE(w->saveWorkbookFile(good), QString());
        QVERIFY(!wb.isModified());
        QVERIFY(w->windowTitle().startsWith(QStringLiteral("fund.tailwise")));

        QFile in(good);
        QVERIFY(in.open(QIODevice::ReadOnly));
        const QByteArray json = in.readAll();
        const QString truncated = dir.filePath(QStringLiteral("truncated.tailwise"));
        {
            QFile out(truncated);
            QVERIFY(out.open(QIODevice::WriteOnly));
            out.write(json.left(json.size() / 2));
        }
        edit::setTitle(wb, QStringLiteral("Kept as it was"));
        const double var = wb.results().report()->figures.var;
        const QString problem = w->openWorkbookFile(truncated);
        QVERIFY2(problem.contains(QStringLiteral("truncated.tailwise")), qPrintable(problem));
        QCOMPARE(wb.title(), QStringLiteral("Kept as it was"));
        QCOMPARE(wb.holdings().size(), std::size_t(13));
        QVERIFY(wb.isModified());
        QCOMPARE(wb.results().report()->figures.var, var);

        // Reopening the saved file brings back every input.
        QCOMPARE(w->openWorkbookFile(good), QString());
        QCOMPARE(wb.holdings().size(), std::size_t(13));
        QCOMPARE(wb.holdings()[12].quantity, -120.0);
        QVERIFY(!wb.isModified());
        w->results().computeNow(Part::Headline);
        QCOMPARE(wb.results().report()->figures.var, var);
    }

    void holdingsModelPassesTheTester()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        HoldingsModel *model = w->holdingsEditor()->model();
        QAbstractItemModelTester tester(model, QAbstractItemModelTester::FailureReportingMode::QtTest);
        QAbstractItemModelTester proxyTester(w->holdingsEditor()->tableView()->model(),
                                             QAbstractItemModelTester::FailureReportingMode::QtTest);
        // Inserts, edits, removals, resets and new results, all watched by the testers.
        QVERIFY(model->setData(model->index(1, HoldingsModel::QuantityColumn), QStringLiteral("1234.5")));
        QVERIFY(model->setData(model->index(1, HoldingsModel::PriceColumn), 150.25));
        QVERIFY(model->setData(model->index(1, HoldingsModel::PriceColumn), QString()));
        w->results().computeNow(Part::Headline);
        edit::removeHoldings(wb, {0, 3, 4});
        w->results().computeNow(Part::Headline);
        QVERIFY(w->holdingsEditor()->addHolding().isEmpty());
        w->holdingsEditor()->tableView()->sortByColumn(HoldingsModel::MarketValueColumn, Qt::DescendingOrder);
        QVERIFY(w->holdingsEditor()->importHoldingsFile(samplePath("holdings.csv")).isEmpty());
        w->results().computeNow(Part::Headline);
        while (wb.undoStack()->canUndo())
            wb.undoStack()->undo();
        w->results().computeNow(Part::Headline);
        QCOMPARE(model->rowCount(), 0);
        QCOMPARE(model->index(0, 0).isValid(), false);
    }

    // Ctrl+V and Delete act on the holdings only while the table has the focus: in a field of the
    // assumptions they keep their ordinary meaning.
    void pasteAndDeleteKeysBelongToTheTable()
    {
        auto w = sampleWindow();
        w->show();
        QVERIFY(QTest::qWaitForWindowActive(w.get()));
        Workbook &wb = w->workbook();
        QApplication::clipboard()->setText(QStringLiteral("LARK_ENERGY\t5"));
        auto *spin = w->findChild<QDoubleSpinBox *>(QStringLiteral("confidence"));
        spin->setFocus();
        QTest::keyClick(spin, Qt::Key_V, Qt::ControlModifier);
        QCOMPARE(wb.holdings()[0].quantity, 9000.0);
        auto *view = w->holdingsEditor()->tableView();
        view->setFocus();
        QTest::keyClick(view, Qt::Key_V, Qt::ControlModifier);
        QCOMPARE(wb.holdings()[0].quantity, 5.0);
        view->selectRow(0);
        QTest::keyClick(view, Qt::Key_Delete);
        QCOMPARE(wb.holdings().size(), std::size_t(12));
        QCOMPARE(wb.holdings()[0].asset, std::string("FENWAY_RAIL"));
    }

    void numbersFollowTheLocale()
    {
        QLocale::setDefault(QLocale(QLocale::German, QLocale::Germany));
        QCOMPARE(moneyText(1234567.891), QStringLiteral("1.234.567,89"));
        QCOMPARE(readNumber(QStringLiteral("1.234,5")).value_or(0), 1234.5);
        QCOMPARE(readNumber(QStringLiteral("1234.5")).value_or(0), 1234.5); // C form still reads
        QVERIFY(!readNumber(QStringLiteral("nan")));
        QCOMPARE(moneyText(std::nan("")), QStringLiteral("\u2014"));
        QLocale::setDefault(QLocale(QLocale::English, QLocale::UnitedKingdom));
        QCOMPARE(moneyText(-0.0), QStringLiteral("0.00"));
    }
};

QTEST_MAIN(TestWorkbenchWindow)
#include "test_workbenchwindow.moc"
