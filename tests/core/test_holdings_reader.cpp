// The holdings reader (holdings.h): every refusal names the file, line and column; exposures
// follow e_i = quantity_i × (override or last close), or the value given.
#include "readererrors.h"

#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QFile>
#include <QTemporaryDir>
#include <QTest>

#include <string>

using namespace tailwise;
using tailwise::test::ExpectedPlace;

namespace {

const std::string src = "holdings.csv";

} // namespace

class TestHoldingsReader : public QObject {
    Q_OBJECT

    PriceHistory m_prices;

    Result<Holdings> parse(const std::string &text) const { return parseHoldingsCsv(text, src, &m_prices); }

private slots:
    void initTestCase()
    {
        auto p = parsePriceCsv("date,A,B,C D\n2020-01-01,10,20,30\n2020-01-02,11,21,31\n2020-01-03,12,22,32\n",
                               "prices.csv");
        QVERIFY2(p.ok(), p.ok() ? "" : p.error().message.c_str());
        m_prices = std::move(p).value();
    }

    void emptyFile()
    {
        TW_EXPECT_ERROR(parse(""), ErrorKind::Format, src, 0, 0, "the file is empty");
        TW_EXPECT_ERROR(parse("\n\n"), ErrorKind::Format, src, 0, 0, "expected a header 'asset,quantity'");
    }

    void headerOnly()
    {
        TW_EXPECT_ERROR(parse("asset,quantity\n"), ErrorKind::InsufficientData, src, 2, 0, "a header but no holdings");
    }

    void unknownColumn()
    {
        TW_EXPECT_ERROR(parse("asset,qty\nA,1\n"), ErrorKind::Format, src, 1, 2,
                        "unknown column \"qty\": expected asset, quantity, price or value");
    }

    void duplicateColumn()
    {
        TW_EXPECT_ERROR(parse("asset,quantity,Quantity\n"), ErrorKind::Format, src, 1, 3, "'quantity' appears twice");
    }

    void missingAssetColumn()
    {
        TW_EXPECT_ERROR(parse("quantity,price\n1,2\n"), ErrorKind::Format, src, 1, 0, "expected an 'asset' column");
    }

    void quantityAndValueBothOrNeither()
    {
        TW_EXPECT_ERROR(parse("asset,quantity,value\nA,1,2\n"), ErrorKind::Format, src, 1, 0,
                        "exactly one of the columns 'quantity' or 'value'");
        TW_EXPECT_ERROR(parse("asset\nA\n"), ErrorKind::Format, src, 1, 0, "exactly one of");
        TW_EXPECT_ERROR(parse("asset,value,price\nA,100,2\n"), ErrorKind::Format, src, 1, 3,
                        "a 'price' column applies to quantities");
    }

    void notANumber_data()
    {
        QTest::addColumn<QString>("text");
        QTest::addColumn<int>("line");
        QTest::addColumn<int>("column");
        QTest::addColumn<QString>("says");
        QTest::newRow("quantity text") << "asset,quantity\nA,1\nB,ten\n" << 3 << 2 << "expected a quantity (a finite number), found \"ten\"";
        QTest::newRow("quantity empty") << "asset,quantity\nA,\n" << 2 << 2 << "found an empty cell";
        QTest::newRow("quantity nan") << "asset,quantity\nA,nan\n" << 2 << 2 << "found \"nan\"";
        QTest::newRow("quantity inf") << "asset,quantity\nA,-inf\n" << 2 << 2 << "found \"-inf\"";
        QTest::newRow("value text") << "asset,value\nA,1e5\nB,1,000\n" << 3 << 3 << "the row has 3 cells, expected 2";
        QTest::newRow("value comma decimal") << "asset,value\nA,\"1,5\"\n" << 2 << 2 << "expected a value (a finite number), found \"1,5\"";
        QTest::newRow("columns swapped") << "quantity,asset\nA,5\n" << 2 << 1 << "expected a quantity";
    }

    void notANumber()
    {
        QFETCH(QString, text);
        QFETCH(int, line);
        QFETCH(int, column);
        QFETCH(QString, says);
        const ErrorKind kind = says.startsWith("the row has") ? ErrorKind::Format : ErrorKind::Value;
        TW_EXPECT_ERROR(parse(text.toStdString()), kind, src, line, column, says.toStdString());
    }

    void badPriceOverride()
    {
        TW_EXPECT_ERROR(parse("asset,quantity,price\nA,10,0\n"), ErrorKind::Value, src, 2, 3, "greater than zero, found 0");
        TW_EXPECT_ERROR(parse("asset,quantity,price\nA,10,12\nB,5,-3\n"), ErrorKind::Value, src, 3, 3,
                        "greater than zero, found -3");
        TW_EXPECT_ERROR(parse("asset,quantity,price\nA,10,abc\n"), ErrorKind::Value, src, 2, 3,
                        "expected a price (a finite number), found \"abc\"");
        TW_EXPECT_ERROR(parse("asset,price,quantity\nA,inf,10\n"), ErrorKind::Value, src, 2, 2, "found \"inf\"");
    }

    void unknownAsset()
    {
        TW_EXPECT_ERROR(parse("asset,quantity\nA,1\nZ,2\n"), ErrorKind::Reference, src, 3, 1,
                        "the asset \"Z\" is not in the price history (prices.csv)");
        // Names are exact: case and surrounding quotes matter, blanks are trimmed.
        TW_EXPECT_ERROR(parse("asset,quantity\na,1\n"), ErrorKind::Reference, src, 2, 1, "\"a\" is not in the price history");
        TW_EXPECT_ERROR(parse("quantity,asset\n1,Q\n"), ErrorKind::Reference, src, 2, 2, "\"Q\"");
    }

    void duplicateAsset()
    {
        TW_EXPECT_ERROR(parse("asset,quantity\nA,1\n\nB,2\nA,3\n"), ErrorKind::Reference, src, 5, 1,
                        "the asset \"A\" is listed twice (first on line 2)");
    }

    void emptyAssetName()
    {
        TW_EXPECT_ERROR(parse("asset,quantity\n,1\n"), ErrorKind::Format, src, 2, 1, "expected an asset name");
    }

    void raggedRows()
    {
        TW_EXPECT_ERROR(parse("asset,quantity,price\nA,1\n"), ErrorKind::Format, src, 2, 3, "the row has 2 cells, expected 3");
        TW_EXPECT_ERROR(parse("asset,quantity\nA,1,2\n"), ErrorKind::Format, src, 2, 3, "the row has 3 cells, expected 2");
    }

    void unclosedQuote()
    {
        TW_EXPECT_ERROR(parse("asset,quantity\n\"A,1\n"), ErrorKind::Format, src, 2, 1, "not closed");
        TW_EXPECT_ERROR(parse("\"asset,quantity\n"), ErrorKind::Format, src, 1, 1, "not closed");
    }

    void missingFileAndFolder()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const std::string missing = dir.filePath("none.csv").toStdString();
        TW_EXPECT_ERROR(readHoldingsCsv(missing, &m_prices), ErrorKind::FileUnreadable, missing, 0, 0, "does not exist");
        const std::string folder = dir.path().toStdString();
        TW_EXPECT_ERROR(readHoldingsCsv(folder, &m_prices), ErrorKind::FileUnreadable, folder, 0, 0, "a folder, not a file");
        const QString bad = dir.filePath("bad.csv");
        QFile f(bad);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write("asset,quantity\r\nA,1\r\nB,x\r\n");
        f.close();
        TW_EXPECT_ERROR(readHoldingsCsv(bad.toStdString(), &m_prices), ErrorKind::Value, bad.toStdString(), 3, 2, "\"x\"");
    }

    void quantitiesWithShortAndOverride()
    {
        auto r = parse("\xEF\xBB\xBF\"Asset\",\"Quantity\",\"Price\"\r\nA,100,\r\n\"C D\",-50,35.5\r\nB, 2.5 ,\r\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        const Holdings &h = r.value();
        QCOMPARE(h.size(), std::size_t(3));
        QCOMPARE(h[1].asset, std::string("C D"));
        QCOMPARE(h[1].quantity, -50.0);
        QVERIFY(!h[0].priceOverride.has_value()); // an empty price cell keeps the last close
        // e_i = quantity × price: last close 12 for A, the override 35.5 for C D, 22 for B.
        QCOMPARE(holdingPrice(h[0], m_prices), 12.0);
        QCOMPARE(holdingExposure(h[0], m_prices), 1200.0);
        QCOMPARE(holdingExposure(h[1], m_prices), -50.0 * 35.5);
        QCOMPARE(holdingExposure(h[2], m_prices), 2.5 * 22.0);
    }

    void values()
    {
        auto r = parse("value,asset\n-1e6,B\n250000.5,A\n");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        QCOMPARE(holdingExposure(r.value()[0], m_prices), -1e6);
        QCOMPARE(holdingExposure(r.value()[1], m_prices), 250000.5);
    }

    void withoutPricesAnyAssetIsAccepted()
    {
        auto r = parseHoldingsCsv("asset,quantity\nNOT_THERE,1\n", src, nullptr);
        QVERIFY(r.ok());
        // ... and checkHoldings then names the holding row.
        auto check = checkHoldings(r.value(), m_prices);
        QVERIFY(!check.ok());
        QCOMPARE(check.error().field, std::string("holding 1"));
        QVERIFY2(check.error().message.find("\"NOT_THERE\" is not in the price history") != std::string::npos,
                 check.error().message.c_str());
        Holdings twice{Holding{"A", 1, {}, {}}, Holding{"A", 2, {}, {}}};
        auto dup = checkHoldings(twice, m_prices);
        QVERIFY(!dup.ok());
        QCOMPARE(dup.error().field, std::string("holding 2"));
        QVERIFY2(dup.error().message.find("already held in holding 1") != std::string::npos, dup.error().message.c_str());
    }

    void writeThenReadGivesTheSameHoldings()
    {
        auto r = parse("asset,quantity,price\nA,0.1,\n\"C D\",-3,1.25\n");
        QVERIFY(r.ok());
        auto again = parse(writeHoldingsCsv(r.value()));
        QVERIFY2(again.ok(), again.ok() ? "" : again.error().message.c_str());
        QCOMPARE(again.value().size(), r.value().size());
        for (std::size_t i = 0; i < r.value().size(); ++i) {
            QCOMPARE(again.value()[i].asset, r.value()[i].asset);
            QCOMPARE(again.value()[i].quantity, r.value()[i].quantity);
            QCOMPARE(again.value()[i].priceOverride, r.value()[i].priceOverride);
        }
    }
};

QTEST_GUILESS_MAIN(TestHoldingsReader)
#include "test_holdings_reader.moc"
