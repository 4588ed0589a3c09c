// The price reader's size guards (prices.h, PriceLimits): each limit is refused with a message
// naming the file and the line, and the input just inside it is accepted. Inputs are generated
// here; the oversized file is sparse (its size is set, nothing is written), so the test needs
// neither the disk nor the memory it describes. The limits themselves are the project's own
// choice (common practice: bound what a wrong file can claim).
#include "tailwise/date.h"
#include "tailwise/prices.h"

#include <QTemporaryDir>
#include <QTest>

#include <filesystem>
#include <fstream>
#include <string>

using namespace tailwise;

namespace {

// `rows` rows of one asset, dates one day apart from 1900-01-01 (every row a valid date).
std::string manyRows(std::size_t rows)
{
    std::string out = "date,A\n";
    out.reserve(rows * 14 + 8);
    const Date start = dateFromCivil(1900, 1, 1);
    for (std::size_t i = 0; i < rows; ++i) {
        out += toIso(Date{start.serial + static_cast<int>(i)});
        out += ",1\n";
    }
    return out;
}

std::string header(std::size_t assets)
{
    std::string out = "date";
    out.reserve(assets * 7 + 8);
    for (std::size_t i = 0; i < assets; ++i)
        out += ",X" + std::to_string(i);
    return out + "\n";
}

void expectRefused(const Result<PriceHistory> &r, int line, const char *phrase)
{
    QVERIFY2(!r.ok(), "expected a refusal, but the input was accepted");
    const std::string &m = r.error().message;
    QVERIFY2(r.error().file == "big.csv", m.c_str());
    QVERIFY2(r.error().line == line, qPrintable(QStringLiteral("line %1, expected %2: %3").arg(r.error().line).arg(line).arg(m.c_str())));
    QVERIFY2(m.find(phrase) != std::string::npos, qPrintable(QStringLiteral("\"%1\" lacks \"%2\"").arg(m.c_str(), phrase)));
}

} // namespace

class TestPriceLimits : public QObject {
    Q_OBJECT

private slots:
    void lineLength()
    {
        const std::size_t limit = PriceLimits::maxLineBytes;
        std::string text = "date,A\n2024-01-02,";
        text += std::string(limit - 11 + 1, '1'); // the data line is one byte over
        text += "\n";
        expectRefused(parsePriceCsv(text, "big.csv"), 2, "longer than the limit");
        // A header line over the limit is refused as well.
        expectRefused(parsePriceCsv("date," + std::string(limit, 'A') + "\n", "big.csv"), 1, "longer than the limit");
    }

    void columns()
    {
        const std::size_t limit = PriceLimits::maxAssets;
        expectRefused(parsePriceCsv(header(limit + 1), "big.csv"), 1,
                      (std::to_string(limit + 1) + " assets, over the limit of " + std::to_string(limit)).c_str());
        // At the limit, the header is accepted (three rows of empty cells, then one price each).
        std::string text = header(limit);
        for (const char *date : {"2024-01-02", "2024-01-03", "2024-01-04"}) {
            text += date;
            for (std::size_t i = 0; i < limit; ++i)
                text += ",1";
            text += '\n';
        }
        const auto r = parsePriceCsv(text, "big.csv");
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        QCOMPARE(r.value().assetCount(), static_cast<int>(limit));
    }

    void rows()
    {
        const std::size_t limit = PriceLimits::maxRows;
        const auto atLimit = parsePriceCsv(manyRows(limit), "big.csv");
        QVERIFY2(atLimit.ok(), atLimit.ok() ? "" : atLimit.error().message.c_str());
        QCOMPARE(atLimit.value().dayCount(), static_cast<int>(limit));
        // Line 1 is the header, so the first row over the limit is on line limit + 2.
        expectRefused(parsePriceCsv(manyRows(limit + 1), "big.csv"), static_cast<int>(limit) + 2, "rows: over the limit");
    }

    void cellsInAll()
    {
        // Many columns of empty cells (gaps) would otherwise claim 8 bytes per cell for a byte of
        // text; the total is bounded. 20000 assets × 501 rows > 10,000,000 cells.
        const std::size_t assets = PriceLimits::maxAssets;
        const std::size_t rowsAllowed = PriceLimits::maxCells / assets;
        std::string text = header(assets);
        const std::string empties(assets, ',');
        const Date start = dateFromCivil(2000, 1, 1);
        for (std::size_t i = 0; i <= rowsAllowed; ++i)
            text += toIso(Date{start.serial + static_cast<int>(i)}) + empties + "\n";
        expectRefused(parsePriceCsv(text, "big.csv"), static_cast<int>(rowsAllowed) + 2, "prices in all");
    }

    void fileSize()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const std::string path = (std::filesystem::path(dir.path().toStdString()) / "big.csv").string();
        { std::ofstream create(path); }
        std::error_code ec;
        std::filesystem::resize_file(path, PriceLimits::maxFileBytes + 1, ec); // sparse: no data written
        QVERIFY2(!ec, ec.message().c_str());
        const auto r = readPriceCsv(path);
        QVERIFY(!r.ok());
        QCOMPARE(r.error().kind, ErrorKind::FileUnreadable);
        QCOMPARE(r.error().file, path);
        QVERIFY2(r.error().message.find("over the limit of 512 MiB") != std::string::npos, r.error().message.c_str());
    }
};

QTEST_GUILESS_MAIN(TestPriceLimits)
#include "test_price_limits.moc"
