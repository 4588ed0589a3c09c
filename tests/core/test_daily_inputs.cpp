// Reproducible runs: SHA-256, the input hash, the as-of cut and limits.
// Sources: SHA-256 test vectors of NIST FIPS 180-4 (the "abc", two-block and one-million-"a"
// messages of NIST's published examples; every digest here, the empty message's too, checked with
// /usr/bin/python3 -c 'import hashlib; print(hashlib.sha256(b"abc").hexdigest())'); the real data set tests/data/eu-stock-indices-1991-1998.csv.
// Limit states follow the thresholds stated in tailwise/limits.h (common practice: a warning
// level below the limit, breached above it).
#include "tailwise/asof.h"
#include "tailwise/inputhash.h"
#include "tailwise/limits.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"
#include "tailwise/sha256.h"

#include <QTest>

#include <fstream>
#include <sstream>
#include <string>

using namespace tailwise;

namespace {

std::string readText(const std::string &path)
{
    std::ifstream in(path, std::ios::binary);
    std::stringstream s;
    s << in.rdbuf();
    return s.str();
}

const std::string kEu = TAILWISE_TEST_DATA_DIR "/eu-stock-indices-1991-1998.csv";

PriceHistory parse(const std::string &text)
{
    auto p = parsePriceCsv(text, "test.csv");
    Q_ASSERT(p.ok());
    return p.value();
}

// The CSV with its columns in another order (date first, then assets reversed).
std::string reorderColumns(const std::string &text)
{
    std::istringstream in(text);
    std::string line, out;
    while (std::getline(in, line)) {
        std::vector<std::string> cells;
        std::stringstream ls(line);
        std::string cell;
        while (std::getline(ls, cell, ','))
            cells.push_back(cell);
        out += cells[0];
        for (std::size_t i = cells.size() - 1; i >= 1; --i)
            out += "," + cells[i];
        out += "\n";
    }
    return out;
}

std::string withCrlf(const std::string &text)
{
    std::string out;
    for (const char c : text) {
        if (c == '\n')
            out += '\r';
        out += c;
    }
    return out;
}

Holdings euHoldings()
{
    return {Holding{"DAX", 100.0, std::nullopt, std::nullopt}, Holding{"SMI", -40.0, std::nullopt, std::nullopt},
            Holding{"FTSE", 60.0, std::nullopt, std::nullopt}};
}

} // namespace

class TestDailyInputs : public QObject {
    Q_OBJECT

private slots:
    void sha256MatchesTheStandardsVectors()
    {
        // NIST FIPS 180-4 example messages (NIST CSRC "SHA256.pdf" examples).
        QCOMPARE(sha256Hex("abc"), std::string("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"));
        QCOMPARE(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
                 std::string("248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"));
        QCOMPARE(sha256Hex(std::string(1000000, 'a')),
                 std::string("cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"));
        // Python hashlib.sha256(b"").hexdigest()
        QCOMPARE(sha256Hex(""), std::string("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"));
        // Fed in pieces that straddle the 64-byte blocks: the same digest.
        Sha256 h;
        const std::string m(1000000, 'a');
        for (std::size_t i = 0; i < m.size(); i += 37)
            h.update(std::string_view(m).substr(i, 37));
        QCOMPARE(h.finishHex(), std::string("cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"));
    }

    void inputHashIgnoresLineEndsAndColumnOrder()
    {
        const std::string text = readText(kEu);
        const Assumptions a;
        const std::string base = inputSha256(parse(text), euHoldings(), a);
        QCOMPARE(base.size(), std::size_t(64));
        QCOMPARE(inputSha256(parse(withCrlf(text)), euHoldings(), a), base);
        QCOMPARE(inputSha256(parse(reorderColumns(text)), euHoldings(), a), base);
        Holdings reversed = euHoldings();
        std::reverse(reversed.begin(), reversed.end());
        QCOMPARE(inputSha256(parse(text), reversed, a), base);
    }

    void inputHashChangesWithAnyPriceHoldingOrAssumption()
    {
        const PriceHistory prices = parse(readText(kEu));
        const Assumptions a;
        const std::string base = inputSha256(prices, euHoldings(), a);
        // Every price of a few rows and columns, nudged by one unit in the last place.
        for (int r : {0, 1, prices.dayCount() / 2, prices.dayCount() - 1})
            for (int c = 0; c < prices.assetCount(); ++c) {
                PriceHistory changed = prices;
                changed.prices(r, c) = std::nextafter(changed.prices(r, c), 1e300);
                QVERIFY(inputSha256(changed, euHoldings(), a) != base);
            }
        Holdings more = euHoldings();
        more[0].quantity = 101.0;
        QVERIFY(inputSha256(prices, more, a) != base);
        Assumptions other = a;
        other.confidence = 0.975;
        QVERIFY(inputSha256(prices, euHoldings(), other) != base);
        other = a;
        other.seed = 2;
        QVERIFY(inputSha256(prices, euHoldings(), other) != base);
        // The multi-day scaling: aggregate changes the hash; the default writes nothing, so the
        // text (and hash) of inputs made before the choice existed stay as they were.
        other = a;
        other.scaling = MultiDayScaling::Aggregate;
        QVERIFY(inputSha256(prices, euHoldings(), other) != base);
        QVERIFY(canonicalAssumptionsText(other).find("scaling=aggregate\n") != std::string::npos);
        QVERIFY(canonicalAssumptionsText(a).find("scaling") == std::string::npos);
    }

    void asOfEqualsAHistoryCutAtThatDate()
    {
        // The file's own rows up to 1995-06-30, as text: the run a user would make on that day.
        const std::string text = readText(kEu);
        std::string cutText;
        {
            std::istringstream in(text);
            std::string line;
            while (std::getline(in, line))
                if (line.rfind("date", 0) == 0 || line.substr(0, 10) <= "1995-06-30")
                    cutText += line + "\n";
        }
        const PriceHistory full = parse(text);
        const auto cut = cutHistoryAt(full, *parseIsoDate("1995-06-30"));
        QVERIFY(cut.ok());
        const PriceHistory onThatDay = parse(cutText);
        QCOMPARE(cut.value().dayCount(), onThatDay.dayCount());
        Assumptions a;
        a.window = 500;
        const auto r1 = computeRisk(cut.value(), euHoldings(), a);
        const auto r2 = computeRisk(onThatDay, euHoldings(), a);
        QVERIFY(r1.ok() && r2.ok());
        QCOMPARE(r1.value().figures.var, r2.value().figures.var);
        QCOMPARE(r1.value().figures.es, r2.value().figures.es);
        QCOMPARE(r1.value().portfolioValue, r2.value().portfolioValue);
        QCOMPARE(toIso(r1.value().windowLast), std::string("1995-06-30"));
        QCOMPARE(inputSha256(cut.value(), euHoldings(), a), inputSha256(onThatDay, euHoldings(), a));
        // A Saturday takes the Friday before: 1995-07-01 was a Saturday.
        const auto saturday = cutHistoryAt(full, *parseIsoDate("1995-07-01"));
        QVERIFY(saturday.ok());
        QCOMPARE(toIso(saturday.value().dates.back()), std::string("1995-06-30"));
    }

    void asOfOutsideTheHistoryIsRefused()
    {
        const PriceHistory full = parse(readText(kEu));
        const auto before = cutHistoryAt(full, *parseIsoDate("1990-01-01"));
        QVERIFY(!before.ok());
        QVERIFY(before.error().message.find("1990-01-01 is before") != std::string::npos);
        QCOMPARE(before.error().field, std::string("as-of"));
        const auto after = cutHistoryAt(full, *parseIsoDate("2030-01-01"));
        QVERIFY(!after.ok());
        QVERIFY(after.error().message.find("after the history") != std::string::npos);
        QVERIFY(!parseAsOfDate("31/12/1995").ok());
    }

    void limitsParseAndRefuse()
    {
        auto l = parseLimit("var=250000");
        QVERIFY(l.ok());
        QCOMPARE(l.value().amount, 250000.0);
        QVERIFY(!l.value().percentOfValue);
        QCOMPARE(l.value().warningLevel, 0.8);
        l = parseLimit("es=2.5%,warn=90%");
        QVERIFY(l.ok());
        QCOMPARE(l.value().measure, LimitMeasure::Es);
        QVERIFY(l.value().percentOfValue);
        QCOMPARE(l.value().amount, 2.5);
        QCOMPARE(l.value().warningLevel, 0.9);
        QCOMPARE(parseLimit(limitText(l.value())).value(), l.value());
        l = parseLimit("var=1e6,group=Equities");
        QVERIFY(l.ok());
        QCOMPARE(l.value().group, std::string("Equities"));
        const auto unknown = checkLimits({l.value()}, {});
        QVERIFY(!unknown.ok());
        QVERIFY(unknown.error().message.find("unknown group \"Equities\"") != std::string::npos);
        for (const char *bad : {"var=0", "var=-5", "vol=100", "var", "var=abc", "var=5,warn=80", "var=5,warn=120%", "var=5,colour=red"}) {
            const auto r = parseLimit(bad);
            QVERIFY2(!r.ok(), bad);
            QCOMPARE(r.error().field, std::string("--limit"));
        }
    }

    void limitStatesAtTheirThresholds()
    {
        const LimitFigures f{80.0, 100.0, 4000.0};
        const auto uses = evaluateLimits({parseLimit("var=100").value(), parseLimit("var=100.01").value(),
                                          parseLimit("es=100").value(), parseLimit("es=99.99").value(),
                                          parseLimit("var=2.5%,warn=50%").value(), parseLimit("var=1000").value()},
                                         f);
        QVERIFY(uses.ok());
        const auto &u = uses.value();
        QCOMPARE(u[0].state, LimitState::Warning); // use 0.8 = the warning level
        QCOMPARE(u[0].use, 0.8);
        QCOMPARE(u[1].state, LimitState::Ok);      // just under 0.8
        QCOMPARE(u[2].state, LimitState::Warning); // use 1: at the limit, not over it
        QCOMPARE(u[3].state, LimitState::Breached);
        QCOMPARE(u[4].limitMoney, 100.0);          // 2.5 % of 4,000
        QCOMPARE(u[4].state, LimitState::Warning);
        QCOMPARE(u[5].state, LimitState::Ok);
        QVERIFY(anyBreached(u));
        QVERIFY(!evaluateLimits({parseLimit("var=1%").value()}, LimitFigures{1.0, 1.0, 0.0}).ok());
    }
};

QTEST_GUILESS_MAIN(TestDailyInputs)
#include "test_daily_inputs.moc"
