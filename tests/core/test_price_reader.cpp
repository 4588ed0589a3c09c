// The price history reader (prices.h): every refusal names the file, line and column, and the
// text rules (BOM, CRLF, quoted names, blank lines, gaps) behave as the header says.
#include "readererrors.h"

#include "tailwise/prices.h"

#include <QDir>
#include <QFile>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>
#include <string>
#include <vector>

using namespace tailwise;
using tailwise::test::ExpectedPlace;

namespace {

const std::string src = "prices.csv";

Result<PriceHistory> parse(const std::string &text) { return parsePriceCsv(text, src); }

// Three good rows after a header with assets A and B, for tests that append one bad line.
const std::string goodStart = "date,A,B\n2020-01-01,1,2\n2020-01-02,1.5,2.5\n2020-01-03,1.25,2.25\n";

bool hasWarning(const PriceHistory &h, const std::string &phrase)
{
    for (const auto &w : h.warnings)
        if (w.find(phrase) != std::string::npos)
            return true;
    return false;
}

QString warningsText(const PriceHistory &h)
{
    QString s;
    for (const auto &w : h.warnings)
        s += QString::fromStdString(w) + " | ";
    return s.isEmpty() ? QStringLiteral("(no warnings)") : s;
}

} // namespace

class TestPriceReader : public QObject {
    Q_OBJECT

private slots:
    void emptyFile()
    {
        TW_EXPECT_ERROR(parse(""), ErrorKind::Format, src, 0, 0, "the file is empty");
        TW_EXPECT_ERROR(parse("\n\r\n\n"), ErrorKind::Format, src, 0, 0, "the file is empty");
    }

    void headerOnly()
    {
        TW_EXPECT_ERROR(parse("date,A,B\n"), ErrorKind::InsufficientData, src, 2, 0, "has a header but no prices");
    }

    void tooFewRows()
    {
        TW_EXPECT_ERROR(parse("date,A\n2020-01-01,1\n2020-01-02,2\n"), ErrorKind::InsufficientData, src, 0, 0,
                        "only 2 rows of prices");
    }

    void badFirstColumn()
    {
        TW_EXPECT_ERROR(parse("day,A\n2020-01-01,1\n"), ErrorKind::Format, src, 1, 1,
                        "expected the first column to be named 'date', found \"day\"");
        // The header is the first non-blank line: its number counts the blank lines before it.
        TW_EXPECT_ERROR(parse("\n\nasset,A\n"), ErrorKind::Format, src, 3, 1, "named 'date'");
    }

    void noAssetColumn()
    {
        TW_EXPECT_ERROR(parse("date\n2020-01-01\n"), ErrorKind::Format, src, 1, 2, "at least one asset column");
    }

    void duplicateAssetColumn()
    {
        TW_EXPECT_ERROR(parse("date,A,B,A\n"), ErrorKind::Reference, src, 1, 4, "\"A\" appears twice");
    }

    void emptyAssetName()
    {
        TW_EXPECT_ERROR(parse("date,A,,B\n"), ErrorKind::Format, src, 1, 3, "expected an asset name");
    }

    void unclosedQuoteInHeader()
    {
        TW_EXPECT_ERROR(parse("date,\"A,B\n2020-01-01,1\n"), ErrorKind::Format, src, 1, 2, "not closed");
        TW_EXPECT_ERROR(parse("date,\"A\"x,B\n"), ErrorKind::Format, src, 1, 2, "unexpected text after a quoted cell");
    }

    void badDate_data()
    {
        QTest::addColumn<QString>("date");
        QTest::newRow("month 13") << "2020-13-01";
        QTest::newRow("30 February") << "2020-02-30";
        QTest::newRow("29 February, not leap") << "2019-02-29";
        QTest::newRow("day first") << "01/02/2020";
        QTest::newRow("no padding") << "2020-1-05";
        QTest::newRow("text") << "yesterday";
        QTest::newRow("empty") << "";
    }

    void badDate()
    {
        QFETCH(QString, date);
        const std::string text = goodStart + date.toStdString() + ",1,2\n";
        TW_EXPECT_ERROR(parse(text), ErrorKind::Format, src, 5, 1, "expected a date as YYYY-MM-DD");
    }

    void leapDayIsADate()
    {
        auto r = parse("date,A\n2020-02-28,1\n2020-02-29,2\n2020-03-01,3\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        QCOMPARE(toIso(r.value().dates[1]), std::string("2020-02-29"));
    }

    void datesMustIncrease()
    {
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-02,1,2\n"), ErrorKind::Format, src, 5, 1,
                        "dates must strictly increase: 2020-01-02 does not come after 2020-01-03");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-03,1,2\n"), ErrorKind::Format, src, 5, 1,
                        "2020-01-03 does not come after 2020-01-03");
    }

    void notANumber()
    {
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1,abc\n"), ErrorKind::Value, src, 5, 3,
                        "expected a price (a number), found \"abc\"");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1.2.3,1\n"), ErrorKind::Value, src, 5, 2, "found \"1.2.3\"");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,\"1\",1\n"), ErrorKind::Value, src, 5, 2, "a number");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1;2\n"), ErrorKind::Value, src, 5, 2, "a number");
    }

    void nonFiniteLiterals_data()
    {
        QTest::addColumn<QString>("cell");
        for (const char *s : {"nan", "NaN", "inf", "-inf", "+Infinity", "INF"})
            QTest::newRow(s) << s;
    }

    void nonFiniteLiterals()
    {
        QFETCH(QString, cell);
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1," + cell.toStdString() + "\n"), ErrorKind::Value, src, 5, 3,
                        "expected a finite price, found \"" + cell.toStdString() + "\"");
    }

    void overflowIsRefused()
    {
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1e999,1\n"), ErrorKind::Value, src, 5, 2, "1e999");
    }

    void zeroOrNegativePrice()
    {
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,0,1\n"), ErrorKind::Value, src, 5, 2, "greater than zero, found 0");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1,-2.5\n"), ErrorKind::Value, src, 5, 3,
                        "greater than zero, found -2.5");
    }

    void raggedRows()
    {
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1\n"), ErrorKind::Format, src, 5, 3,
                        "the row has 2 cells, expected 3");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06\n"), ErrorKind::Format, src, 5, 2, "the row has 1 cells");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1,2,3\n"), ErrorKind::Format, src, 5, 4, "more cells than the header");
        TW_EXPECT_ERROR(parse(goodStart + "2020-01-06,1,2,\n"), ErrorKind::Format, src, 5, 4, "more cells");
    }

    void lineNumbersCountBlankLinesAndCrlf()
    {
        TW_EXPECT_ERROR(parse("date,A\r\n\r\n2020-01-01,1\r\n\r\n\r\n2020-01-02,x\r\n"), ErrorKind::Value, src, 6, 2,
                        "found \"x\"");
        // A BOM does not shift columns, nor appear in the message.
        TW_EXPECT_ERROR(parse("\xEF\xBB\xBF" "when,A\n"), ErrorKind::Format, src, 1, 1, "found \"when\"");
    }

    void assetWithoutAnyPrice()
    {
        TW_EXPECT_ERROR(parse("date,A,B\n2020-01-01,1,\n2020-01-02,2,\n2020-01-03,3,\n"), ErrorKind::InsufficientData, src,
                        1, 3, "\"B\" has no price on any row");
    }

    void missingFile()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const std::string path = dir.filePath("nothing-here.csv").toStdString();
        TW_EXPECT_ERROR(readPriceCsv(path), ErrorKind::FileUnreadable, path, 0, 0, "does not exist");
    }

    void folderIsNotAFile()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const std::string path = dir.path().toStdString();
        TW_EXPECT_ERROR(readPriceCsv(path), ErrorKind::FileUnreadable, path, 0, 0, "a folder, not a file");
    }

    void errorInAFileNamesThePath()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath("bad.csv");
        QFile f(path);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write((goodStart + "2020-01-06,1,zero\n").c_str());
        f.close();
        TW_EXPECT_ERROR(readPriceCsv(path.toStdString()), ErrorKind::Value, path.toStdString(), 5, 3, "\"zero\"");
    }

    void bomCrlfAndQuotedNames()
    {
        const std::string text = "\xEF\xBB\xBF\"date\",\"Alpha Fund\", \"B, Inc\" ,\"Say \"\"Hi\"\"\"\r\n"
                                 "2020-01-01,1,2,3\r\n2020-01-02, 1.5 ,2.5,3.5\r\n2020-01-03,1.25,2.25,3.25\r\n";
        auto r = parse(text);
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        const PriceHistory &h = r.value();
        QCOMPARE(h.assets, (std::vector<std::string>{"Alpha Fund", "B, Inc", "Say \"Hi\""}));
        QCOMPARE(h.dayCount(), 3);
        QCOMPARE(h.prices(1, 0), 1.5); // blanks around a cell are trimmed
        QCOMPARE(h.prices(2, 2), 3.25);
        QCOMPARE(h.sourceName, src);
        QVERIFY2(h.warnings.empty(), qPrintable(warningsText(h)));
        // No line end after the last row, and a lower-case header: still fine.
        auto last = parse("DATE,A\n2020-01-01,1\n2020-01-02,2\n2020-01-03,3");
        QVERIFY(last.ok());
        QCOMPARE(last.value().prices(2, 0), 3.0);
    }

    void gapsAreFilledForwardWithAWarning()
    {
        auto r = parse("date,A,B\n2020-01-01,1,10\n2020-01-02,,11\n2020-01-03,,12\n2020-01-06,4,\n2020-01-07,5,13\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        const PriceHistory &h = r.value();
        QCOMPARE(h.dayCount(), 5);
        QCOMPARE(h.prices(1, 0), 1.0);
        QCOMPARE(h.prices(2, 0), 1.0);
        QCOMPARE(h.prices(3, 1), 12.0);
        QVERIFY2(hasWarning(h, "3 empty prices were filled with the previous day's price"), qPrintable(warningsText(h)));
        QVERIFY2(hasWarning(h, src), qPrintable(warningsText(h))); // names the file
    }

    void leadingGapsAreDroppedWithAWarning()
    {
        auto r = parse("date,A,B,C\n2020-01-01,1,,\n2020-01-02,2,20,\n2020-01-03,3,30,300\n2020-01-06,4,40,400\n"
                       "2020-01-07,5,50,500\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        const PriceHistory &h = r.value();
        QCOMPARE(h.dayCount(), 3);
        QCOMPARE(toIso(h.dates.front()), std::string("2020-01-03"));
        QCOMPARE(h.prices(0, 0), 3.0);
        QVERIFY2(hasWarning(h, "dropped the first 2 rows (3 empty cells)"), qPrintable(warningsText(h)));
        QVERIFY2(!hasWarning(h, "filled"), qPrintable(warningsText(h)));
    }

    void gapOnTheFirstKeptRowCarriesTheDroppedPrice()
    {
        // A has prices from the start but a gap on the first row where B has one: the rows
        // before B's first price are dropped, and A's gap takes A's previous price (prices.h),
        // which lies on a dropped row.
        auto r = parse("date,A,B\n2020-01-01,7,\n2020-01-02,,20\n2020-01-03,8,21\n2020-01-06,9,22\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        const PriceHistory &h = r.value();
        QCOMPARE(h.dayCount(), 3);
        QCOMPARE(h.prices(0, 0), 7.0);
        QCOMPARE(h.prices(0, 1), 20.0);
        QVERIFY2(hasWarning(h, "dropped the first 1 row"), qPrintable(warningsText(h)));
        QVERIFY2(hasWarning(h, "1 empty price was filled"), qPrintable(warningsText(h)));
        for (Eigen::Index i = 0; i < h.prices.size(); ++i)
            QVERIFY(std::isfinite(h.prices.data()[i]) && h.prices.data()[i] > 0.0);
    }

    void writeThenReadGivesTheSameHistory()
    {
        auto r = parse("date,A,\"B, Inc\"\n2020-01-01,1.1,2\n2020-01-02,0.30000000000000004,2.5\n2020-01-03,1e-7,123456789.125\n");
        QVERIFY(r.ok());
        auto again = parse(writePriceCsv(r.value()));
        QVERIFY2(again.ok(), again.ok() ? "" : again.error().message.c_str());
        QCOMPARE(again.value().assets, r.value().assets);
        QVERIFY(again.value().dates == r.value().dates);
        QVERIFY(again.value().prices == r.value().prices); // exact: shortest round-trip form
    }

    // A file large enough to be read in chunks on several threads (over 10⁵ cells): the history
    // and every error are those of a reading from top to bottom, whatever the chunk a row is in.
    void largeFileReadsAsFromTopToBottom()
    {
        const int rows = 400, assets = 300;
        std::string text = "date";
        for (int a = 0; a < assets; ++a)
            text += ",S" + std::to_string(a);
        text += "\n";
        std::vector<std::size_t> rowStart; // offset of each data row in `text`
        for (int r = 0; r < rows; ++r) {
            rowStart.push_back(text.size());
            text += toIso(Date{dateFromCivil(2020, 1, 1).serial + r});
            for (int a = 0; a < assets; ++a) {
                // A gap in every chunk, one on a chunk's first row, and one on the first kept row.
                const bool gap = (a == 7 && (r == 1 || r == rows / 2 || r == 3 * rows / 4)) || (a == 9 && r == 0);
                text += ',';
                if (!gap)
                    text += std::to_string(1.0 + 0.001 * r + a);
            }
            text += "\n";
        }
        auto whole = parse(text);
        QVERIFY2(whole.ok(), whole.ok() ? "" : whole.error().message.c_str());
        const PriceHistory &h = whole.value();
        QCOMPARE(h.dayCount(), rows - 1); // row 0 dropped: asset 9 had no price yet
        QCOMPARE(h.prices(0, 7), 1.0 + 0.001 * 0 + 7); // carried from the dropped row 0
        QCOMPARE(h.prices(rows / 2 - 1, 7), 1.0 + 0.001 * (rows / 2 - 1) + 7);
        QCOMPARE(h.prices(3 * rows / 4 - 1, 7), 1.0 + 0.001 * (3 * rows / 4 - 1) + 7);
        QCOMPARE(h.prices(rows - 2, assets - 1), 1.0 + 0.001 * (rows - 1) + assets - 1);
        QVERIFY2(hasWarning(h, "3 empty prices were filled"), qPrintable(warningsText(h)));

        // Line L of the file holds data row L − 2. Two bad rows, one in each half: the first wins.
        auto withBadCell = [&](const std::string &t, int row, const std::string &cell) {
            const std::size_t at = t.find(',', rowStart[static_cast<std::size_t>(row)]) + 1;
            return t.substr(0, at) + cell + t.substr(t.find(',', at));
        };
        const std::string twoBad = withBadCell(withBadCell(text, 3 * rows / 4, "x"), rows / 2 - 5, "-1");
        TW_EXPECT_ERROR(parse(twoBad), ErrorKind::Value, src, rows / 2 - 5 + 2, 2,
                        "expected a price greater than zero, found -1");
        // A date out of order on the first row of the second half comes before a bad cell after it.
        const std::string later = withBadCell(text, rows / 2 + 3, "abc");
        const std::size_t dateAt = rowStart[rows / 2];
        const std::string unordered = later.substr(0, dateAt) + "2020-01-01" + later.substr(dateAt + 10);
        TW_EXPECT_ERROR(parse(unordered), ErrorKind::Format, src, rows / 2 + 2, 1,
                        "dates must strictly increase: 2020-01-01 does not come after");
        // A bad cell on that same row, after an ordered date, is reported as it is.
        TW_EXPECT_ERROR(parse(withBadCell(text, rows / 2, "nan")), ErrorKind::Value, src, rows / 2 + 2, 2,
                        "expected a finite price");
    }

    void realDataSetReads()
    {
        auto r = readPriceCsv(std::string(TAILWISE_TEST_DATA_DIR) + "/eu-stock-indices-1991-1998.csv");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        QCOMPARE(r.value().dayCount(), 1860);
        QCOMPARE(r.value().prices(0, 0), 1628.75); // first DAX close, as in the file
        QCOMPARE(r.value().prices(1859, 3), 5455.0); // last FTSE close
    }
};

QTEST_GUILESS_MAIN(TestPriceReader)
#include "test_price_reader.moc"
