// The workbook file (ui/document/workbookfile.h): save → load is exact, bad files are refused
// with a message naming the place, and a failed save leaves the previous file as it was.
// Guiless: the workbook file needs QtCore only.
#include "document/workbookfile.h"

#include "tailwise/date.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QDir>
#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLocale>
#include <QTemporaryDir>
#include <QTest>
#include <QXmlStreamReader>

#include <bit>
#include <clocale>
#include <cmath>
#include <cstdint>
#include <limits>
#include <random>

#include <unistd.h>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

std::uint64_t bits(double v) { return std::bit_cast<std::uint64_t>(v); }

// Prices with full 53-bit mantissas (e^u for random u), plus the extremes a double can hold, so
// that a round trip through decimal text is tested where it is hardest.
WorkbookContents sampleContents()
{
    WorkbookContents c;
    c.title = QStringLiteral("Testfund «Ω», \"quoted\"\tand tabbed");
    c.currency = QStringLiteral("GBP");
    c.prices.assets = {"ALPHA", "BETA \"B\"", "GAMMA, Ltd", "DELTA/Ü"};
    std::mt19937_64 rng(20261201);
    std::uniform_real_distribution<double> u(-5.0, 9.0);
    const int days = 40;
    for (int d = 0; d < days; ++d)
        c.prices.dates.push_back(Date{dateFromCivil(2024, 1, 2).serial + 2 * d});
    c.prices.prices.resize(days, 4);
    for (int d = 0; d < days; ++d)
        for (int a = 0; a < 4; ++a)
            c.prices.prices(d, a) = std::exp(u(rng));
    // Tiny and huge prices whose day-to-day ratios stay normal numbers (pricecheck.h: a subnormal
    // price, or a ratio that overflows, is refused on reading).
    c.prices.prices(3, 0) = 1.0e-300 * (1.0 + std::numeric_limits<double>::epsilon());
    c.prices.prices(4, 1) = 1.0e300 * (1.0 - std::numeric_limits<double>::epsilon());
    c.prices.prices(5, 2) = 0.1 + 0.2; // 0.30000000000000004
    c.holdings = {
        Holding{"ALPHA", 1234.5, std::nullopt, std::nullopt},
        Holding{"GAMMA, Ltd", -7.25, 12.0 / 7.0, std::nullopt},      // short, with a price override
        Holding{"BETA \"B\"", 0.0, std::nullopt, 1.0e6 / 3.0},       // given by value
        Holding{"DELTA/Ü", 3.0, 99.125, -2.0 / 3.0},                  // override and value together
    };
    Assumptions &a = c.assumptions;
    a.confidence = 0.975 + 1e-13;
    a.horizonDays = 10;
    a.daysPerYear = 250;
    a.window = 30;
    a.returns = ReturnType::Log;
    a.estimator = CovarianceEstimator::Ewma;
    a.lambda = 0.97 + 1e-15;
    a.mean = MeanModel::Sample;
    a.model = RiskModel::StudentT;
    a.dof = DegreesOfFreedom::given(5.0 / 3.0 + 3.0);
    a.historicalHorizon = HistoricalHorizon::Overlapping;
    a.scaling = MultiDayScaling::Aggregate;
    a.simulations = 12345;
    a.seed = std::numeric_limits<std::uint64_t>::max() - 2; // beyond what a JSON number holds
    return c;
}

QJsonObject asObject(const WorkbookContents &c)
{
    const auto json = workbookJson(c);
    if (!json)
        qFatal("sample contents refused: %s", json.error().message.c_str());
    return QJsonDocument::fromJson(json.value()).object();
}

QByteArray toBytes(const QJsonObject &o) { return QJsonDocument(o).toJson(); }

void compareContents(const WorkbookContents &got, const WorkbookContents &want)
{
    QCOMPARE(got.title, want.title);
    QCOMPARE(got.currency, want.currency);
    QCOMPARE(got.prices.assets, want.prices.assets);
    QCOMPARE(got.prices.dates.size(), want.prices.dates.size());
    for (std::size_t i = 0; i < want.prices.dates.size(); ++i)
        QCOMPARE(got.prices.dates[i].serial, want.prices.dates[i].serial);
    QCOMPARE(got.prices.prices.rows(), want.prices.prices.rows());
    QCOMPARE(got.prices.prices.cols(), want.prices.prices.cols());
    for (Eigen::Index r = 0; r < want.prices.prices.rows(); ++r)
        for (Eigen::Index a = 0; a < want.prices.prices.cols(); ++a)
            if (bits(got.prices.prices(r, a)) != bits(want.prices.prices(r, a)))
                QFAIL(qPrintable(QStringLiteral("price (%1, %2) changed: %3 → %4")
                                     .arg(r).arg(a)
                                     .arg(want.prices.prices(r, a), 0, 'g', 17)
                                     .arg(got.prices.prices(r, a), 0, 'g', 17)));
    QCOMPARE(got.holdings.size(), want.holdings.size());
    for (std::size_t i = 0; i < want.holdings.size(); ++i) {
        const Holding &g = got.holdings[i], &w = want.holdings[i];
        QCOMPARE(g.asset, w.asset);
        if (!w.value) // a holding given by value has no quantity in the file
            QCOMPARE(bits(g.quantity), bits(w.quantity));
        QCOMPARE(g.priceOverride.has_value(), w.priceOverride.has_value());
        if (w.priceOverride)
            QCOMPARE(bits(*g.priceOverride), bits(*w.priceOverride));
        QCOMPARE(g.value.has_value(), w.value.has_value());
        if (w.value)
            QCOMPARE(bits(*g.value), bits(*w.value));
    }
    const Assumptions &ga = got.assumptions, &wa = want.assumptions;
    QCOMPARE(bits(ga.confidence), bits(wa.confidence));
    QCOMPARE(ga.horizonDays, wa.horizonDays);
    QCOMPARE(ga.daysPerYear, wa.daysPerYear);
    QCOMPARE(ga.window, wa.window);
    QCOMPARE(ga.returns, wa.returns);
    QCOMPARE(ga.estimator, wa.estimator);
    QCOMPARE(bits(ga.lambda), bits(wa.lambda));
    QCOMPARE(ga.mean, wa.mean);
    QCOMPARE(ga.model, wa.model);
    QCOMPARE(ga.dof.kind, wa.dof.kind);
    QCOMPARE(bits(ga.dof.value), bits(wa.dof.value));
    QCOMPARE(ga.historicalHorizon, wa.historicalHorizon);
    QCOMPARE(ga.scaling, wa.scaling);
    QCOMPARE(ga.simulations, wa.simulations);
    QCOMPARE(ga.seed, wa.seed);
}

bool contains(const std::string &text, const QString &part) { return QString::fromStdString(text).contains(part); }

#define TW_MESSAGE_HAS(message, part)                                                                              \
    QVERIFY2(contains((message), (part)),                                                                          \
             qPrintable(QStringLiteral("message \"%1\" does not contain \"%2\"")                                   \
                            .arg(QString::fromStdString(message), QString(part))))

QByteArray readAll(const QString &path)
{
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly))
        return {};
    return f.readAll();
}

} // namespace

class TestWorkbookFile : public QObject {
    Q_OBJECT
private slots:
    void assumptionsHaveTheFieldsTheFileStores();
    void saveLoadRoundTripsEveryInput_data();
    void saveLoadRoundTripsEveryInput();
    void emptyWorkbookRoundTrips();
    void unknownKeysAreIgnored();
    void olderFileOpensWithDefaults();
    void fileFromAnotherMachineOpens();
    void newerFormatFileIsRefusedByName();
    void refusesBadFiles_data();
    void refusesBadFiles();
    void refusesTruncatedFiles();
    void refusesMissingAndFolderPaths();
    void failedSaveKeepsThePreviousFile();
    void saveIntoReadOnlyFolderFails();
    void saveWhereNoOneMayWriteFails();
    void sampleWorkbookMatchesItsCsvs();
    void desktopFilesNameTheWorkbookType();
};

void TestWorkbookFile::assumptionsHaveTheFieldsTheFileStores()
{
    // A tripwire (common practice): a field added to tailwise::Assumptions changes its size. Give
    // the new field one line in assumptionsJson() and one in readAssumptions() (workbookfile.cpp),
    // a line in compareContents() and sampleContents() here, then update this size.
#if defined(__x86_64__) || defined(__aarch64__)
    QCOMPARE(sizeof(Assumptions), std::size_t(88));
#else
    QSKIP("the size tripwire is set for 64-bit Linux");
#endif
}

void TestWorkbookFile::saveLoadRoundTripsEveryInput_data()
{
    QTest::addColumn<int>("variant");
    QTest::newRow("every field away from its default") << 0;
    QTest::newRow("defaults, window all, dof unset") << 1;
    QTest::newRow("dof fit, monte-carlo, seed 0") << 2;
    QTest::newRow("cornish-fisher, historical, normal") << 3;
}

void TestWorkbookFile::saveLoadRoundTripsEveryInput()
{
    QFETCH(int, variant);
    WorkbookContents want = sampleContents();
    Assumptions &a = want.assumptions;
    switch (variant) {
    case 1: a = Assumptions{}; break;
    case 2: a.dof = DegreesOfFreedom::fit(); a.model = RiskModel::MonteCarlo; a.seed = 0; a.window.reset(); break;
    case 3:
        a.model = RiskModel::CornishFisher;
        a.historicalHorizon = HistoricalHorizon::SquareRoot;
        a.scaling = MultiDayScaling::SquareRoot;
        break;
    default: break;
    }
    QTemporaryDir dir;
    QVERIFY(dir.isValid());
    const QString path = dir.filePath(QStringLiteral("round.tailwise"));
    const auto saved = saveWorkbook(want, path);
    QVERIFY2(saved.ok(), saved.ok() ? "" : saved.error().message.c_str());
    const auto loaded = loadWorkbook(path);
    QVERIFY2(loaded.ok(), loaded.ok() ? "" : loaded.error().message.c_str());
    compareContents(loaded.value(), want);
    QCOMPARE(QString::fromStdString(loaded.value().prices.sourceName), path);

    // Saving what was loaded gives the same bytes: nothing drifts from one save to the next.
    const QString again = dir.filePath(QStringLiteral("again.tailwise"));
    QVERIFY(saveWorkbook(loaded.value(), again).ok());
    QCOMPARE(readAll(again), readAll(path));

    // The file says what it is before anything else is read.
    const QJsonObject root = QJsonDocument::fromJson(readAll(path)).object();
    QCOMPARE(root.value(QStringLiteral("kind")).toString(), QStringLiteral("tailwise-workbook"));
    QCOMPARE(root.value(QStringLiteral("format")).toInt(), 1);
}

void TestWorkbookFile::emptyWorkbookRoundTrips()
{
    // "New", then save: no prices, no holdings yet.
    WorkbookContents want;
    const auto json = workbookJson(want);
    QVERIFY2(json.ok(), json.ok() ? "" : json.error().message.c_str());
    const auto back = parseWorkbookJson(json.value(), QStringLiteral("new.tailwise"));
    QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
    compareContents(back.value(), want);
}

void TestWorkbookFile::unknownKeysAreIgnored()
{
    QJsonObject root = asObject(sampleContents());
    root[QStringLiteral("comment")] = QStringLiteral("written by hand");
    QJsonObject a = root[QStringLiteral("assumptions")].toObject();
    a[QStringLiteral("colour")] = QStringLiteral("teal");
    root[QStringLiteral("assumptions")] = a;
    const auto back = parseWorkbookJson(toBytes(root), QStringLiteral("extra.tailwise"));
    QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
    compareContents(back.value(), sampleContents());
}

// A file from before the optional fields existed (or written by hand with only the essentials):
// it opens, every absent field takes the default of tailwise::Assumptions, and a warning lists
// them with their values.
void TestWorkbookFile::olderFileOpensWithDefaults()
{
    QJsonObject root = asObject(sampleContents());
    root.remove(QStringLiteral("title"));
    root.remove(QStringLiteral("currency")); // a file from before the currency field: none stated
    root.remove(QStringLiteral("backtest"));
    root.remove(QStringLiteral("scenarios"));
    QJsonObject a;
    a[QStringLiteral("confidence")] = 0.975;
    a[QStringLiteral("horizon")] = 10;
    root[QStringLiteral("assumptions")] = a;
    const auto back = parseWorkbookJson(toBytes(root), QStringLiteral("old.tailwise"));
    QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
    Assumptions want; // the documented defaults (assumptions.h)
    want.confidence = 0.975;
    want.horizonDays = 10;
    WorkbookContents expected = sampleContents();
    expected.title.clear();
    expected.currency.clear();
    expected.assumptions = want;
    compareContents(back.value(), expected);
    QVERIFY(!back.value().backtest);
    QVERIFY(back.value().scenarios.empty());
    QCOMPARE(back.value().warnings.size(), std::size_t(1));
    const std::string &note = back.value().warnings.front();
    TW_MESSAGE_HAS(note, QStringLiteral("old.tailwise: the file does not give these assumptions, so their defaults apply"));
    for (const char *part : {"days-per-year 252", "window all", "returns simple", "estimator sample", "lambda 0.94",
                             "mean zero", "model normal", "dof unset", "historical-horizon sqrt", "scaling sqrt",
                             "simulations 100000", "seed 1"})
        TW_MESSAGE_HAS(note, QLatin1String(part));
    QVERIFY(!contains(note, QStringLiteral("confidence")));

    // One field absent: only it is named; a complete file has no warning.
    QJsonObject full = asObject(sampleContents());
    QJsonObject fa = full[QStringLiteral("assumptions")].toObject();
    fa.remove(QStringLiteral("seed"));
    full[QStringLiteral("assumptions")] = fa;
    const auto one = parseWorkbookJson(toBytes(full), QStringLiteral("one.tailwise"));
    QVERIFY(one.ok());
    QCOMPARE(one.value().assumptions.seed, std::uint64_t(1));
    QCOMPARE(one.value().assumptions.lambda, sampleContents().assumptions.lambda);
    QCOMPARE(one.value().warnings.size(), std::size_t(1));
    TW_MESSAGE_HAS(one.value().warnings.front(), QStringLiteral("defaults apply: seed 1"));
    QVERIFY(parseWorkbookJson(toBytes(asObject(sampleContents())), QStringLiteral("x")).value().warnings.empty());

    // A file from before the multi-day scaling was a choice: square-root scaling, as then, said.
    QJsonObject before = asObject(sampleContents());
    QJsonObject ba = before[QStringLiteral("assumptions")].toObject();
    QCOMPARE(ba.value(QStringLiteral("scaling")).toString(), QStringLiteral("aggregate"));
    ba.remove(QStringLiteral("scaling"));
    before[QStringLiteral("assumptions")] = ba;
    const auto rooted = parseWorkbookJson(toBytes(before), QStringLiteral("before.tailwise"));
    QVERIFY(rooted.ok());
    QCOMPARE(rooted.value().assumptions.scaling, MultiDayScaling::SquareRoot);
    QCOMPARE(rooted.value().warnings.size(), std::size_t(1));
    TW_MESSAGE_HAS(rooted.value().warnings.front(), QStringLiteral("defaults apply: scaling sqrt"));
}

// A workbook made where the decimal separator is a comma, opened where it is a point (and the
// other way round): numbers in the file are JSON numbers, always with a '.', whatever the locale
// of the machine that wrote or reads it; the file holds no paths of that machine.
void TestWorkbookFile::fileFromAnotherMachineOpens()
{
    const QLocale previous;
    const std::string previousC = std::setlocale(LC_NUMERIC, nullptr);
    QLocale::setDefault(QLocale(QLocale::German, QLocale::Germany));
    // The C library's own locale too, where this machine has a comma locale installed.
    bool cLocaleComma = false;
    for (const char *name : {"de_DE.UTF-8", "de_DE.utf8", "fr_FR.UTF-8", "fr_FR.utf8"})
        if (std::setlocale(LC_NUMERIC, name)) {
            cLocaleComma = true;
            break;
        }
    const QString dir = QStringLiteral(TAILWISE_SOURCE_DIR "/samples/");
    const auto sample = loadWorkbook(dir + QStringLiteral("larchmere.tailwise"));
    const QByteArray handWritten = R"({"kind": "tailwise-workbook", "format": 1,
        "prices": {"assets": ["A"], "dates": ["2024-01-02", "2024-01-03", "2024-01-04"],
                   "rows": [[1234.5], [1250.25], [1.5e3]]},
        "holdings": [{"asset": "A", "quantity": 0.5}],
        "assumptions": {"confidence": 0.975, "horizon": 10, "lambda": 0.97}})";
    const auto hand = parseWorkbookJson(handWritten, QStringLiteral("from-elsewhere.tailwise"));
    WorkbookContents local = sampleContents();
    local.assumptions.confidence = 0.975;
    const auto written = workbookJson(local);
    QLocale::setDefault(previous);
    std::setlocale(LC_NUMERIC, previousC.c_str());

    QVERIFY2(sample.ok(), sample.ok() ? "" : sample.error().message.c_str());
    QCOMPARE(sample.value().assumptions.confidence, 0.99);
    QVERIFY2(hand.ok(), hand.ok() ? "" : hand.error().message.c_str());
    QCOMPARE(hand.value().prices.prices(0, 0), 1234.5);
    QCOMPARE(hand.value().prices.prices(1, 0), 1250.25);
    QCOMPARE(hand.value().prices.prices(2, 0), 1500.0);
    QCOMPARE(hand.value().holdings[0].quantity, 0.5);
    QCOMPARE(hand.value().assumptions.confidence, 0.975);
    QCOMPARE(hand.value().assumptions.lambda, 0.97);
    // Written under that locale, the numbers still carry a point and read back exactly here.
    QVERIFY(written.ok());
    QVERIFY(written.value().contains("\"confidence\": 0.975"));
    const auto back = parseWorkbookJson(written.value(), QStringLiteral("written-elsewhere.tailwise"));
    QVERIFY(back.ok());
    compareContents(back.value(), local);
    if (!cLocaleComma)
        qInfo("no comma-decimal C locale installed here: checked with Qt's German locale only");
}

void TestWorkbookFile::newerFormatFileIsRefusedByName()
{
    QTemporaryDir dir;
    QJsonObject root = asObject(sampleContents());
    root[QStringLiteral("format")] = 2;
    root[QStringLiteral("something-new")] = QStringLiteral("a field this version does not know");
    const QString path = dir.filePath(QStringLiteral("future.tailwise"));
    {
        QFile f(path);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write(toBytes(root));
    }
    const auto r = loadWorkbook(path);
    QVERIFY(!r.ok());
    QCOMPARE(r.error().message, path.toStdString() + ": made by a newer Tailwise (format 2); this version reads format 1");
}

// Each case edits one thing in a valid workbook; the message must name the file and the place.
void TestWorkbookFile::refusesBadFiles_data()
{
    QTest::addColumn<QByteArray>("bytes");
    QTest::addColumn<int>("kind");
    QTest::addColumn<QStringList>("mentions");

    const QJsonObject good = asObject(sampleContents());
    auto edit = [&](auto change) {
        QJsonObject o = good;
        change(o);
        return toBytes(o);
    };
    auto inObject = [](QJsonObject &root, const char *key, auto change) {
        QJsonObject o = root[QLatin1String(key)].toObject();
        change(o);
        root[QLatin1String(key)] = o;
    };
    auto holding = [](QJsonObject &root, int i, const char *key, const QJsonValue &v) {
        QJsonArray list = root[QStringLiteral("holdings")].toArray();
        QJsonObject h = list[i].toObject();
        if (v.isUndefined())
            h.remove(QLatin1String(key));
        else
            h[QLatin1String(key)] = v;
        list[i] = h;
        root[QStringLiteral("holdings")] = list;
    };
    auto price = [](QJsonObject &root, int row, int col, const QJsonValue &v) {
        QJsonObject p = root[QStringLiteral("prices")].toObject();
        QJsonArray rows = p[QStringLiteral("rows")].toArray();
        QJsonArray r = rows[row].toArray();
        r[col] = v;
        rows[row] = r;
        p[QStringLiteral("rows")] = rows;
        root[QStringLiteral("prices")] = p;
    };
    const auto F = static_cast<int>(ErrorKind::Format);
    const auto V = static_cast<int>(ErrorKind::Value);
    const auto R = static_cast<int>(ErrorKind::Reference);
    const auto A = static_cast<int>(ErrorKind::Assumption);
    const auto D = static_cast<int>(ErrorKind::InsufficientData);

    QTest::newRow("not JSON") << QByteArray("date,ALPHA\n2024-01-02,1\n") << F
                              << QStringList{"line 1, column ", "malformed near byte"};
    QTest::newRow("empty file") << QByteArray("  \n") << F << QStringList{"empty"};
    QTest::newRow("a JSON list") << QByteArray("[1, 2, 3]") << F << QStringList{"not a Tailwise workbook", "a list"};
    QTest::newRow("some other JSON") << QByteArray(R"({"name": "settings", "format": 1})") << F
                                     << QStringList{"not a Tailwise workbook", "no \"kind\""};
    QTest::newRow("another kind") << edit([](QJsonObject &o) { o["kind"] = "spreadsheet"; }) << F
                                  << QStringList{"not a Tailwise workbook", "spreadsheet"};
    QTest::newRow("newer format") << edit([](QJsonObject &o) { o["format"] = 2; }) << F
                                  << QStringList{"made by a newer Tailwise (format 2); this version reads format 1"};
    QTest::newRow("format missing") << edit([](QJsonObject &o) { o.remove("format"); }) << F
                                    << QStringList{"format: expected a format version"};
    QTest::newRow("format not whole") << edit([](QJsonObject &o) { o["format"] = 1.5; }) << V
                                      << QStringList{"format: expected a format version", "1.5"};
    QTest::newRow("newer format, far ahead") << edit([](QJsonObject &o) { o["format"] = 17; }) << F
                                             << QStringList{"made by a newer Tailwise (format 17)", "reads format 1"};
    QTest::newRow("prices missing") << edit([](QJsonObject &o) { o.remove("prices"); }) << F
                                    << QStringList{"prices: missing"};
    QTest::newRow("holdings missing") << edit([](QJsonObject &o) { o.remove("holdings"); }) << F
                                      << QStringList{"holdings: missing"};
    QTest::newRow("assumptions missing") << edit([](QJsonObject &o) { o.remove("assumptions"); }) << F
                                         << QStringList{"assumptions: missing"};
    QTest::newRow("quantity is text") << edit([&](QJsonObject &o) { holding(o, 3, "quantity", "ten"); }) << F
                                      << QStringList{"holdings[3].quantity: expected a number, found a string (\"ten\")"};
    QTest::newRow("quantity is null") << edit([&](QJsonObject &o) { holding(o, 0, "quantity", QJsonValue::Null); }) << F
                                      << QStringList{"holdings[0].quantity: expected a number, found null"};
    QTest::newRow("neither quantity nor value")
        << edit([&](QJsonObject &o) { holding(o, 0, "quantity", QJsonValue::Undefined); }) << F
        << QStringList{"holdings[0]: expected a \"quantity\" or a \"value\""};
    QTest::newRow("price override zero") << edit([&](QJsonObject &o) { holding(o, 1, "price", 0); }) << V
                                         << QStringList{"holdings[1].price: expected a price greater than zero, found 0"};
    QTest::newRow("unknown asset") << edit([&](QJsonObject &o) { holding(o, 2, "asset", "NOWHERE"); }) << R
                                   << QStringList{"holdings[2]: the asset \"NOWHERE\" is not in the price history"};
    QTest::newRow("asset held twice") << edit([&](QJsonObject &o) { holding(o, 3, "asset", "ALPHA"); }) << R
                                      << QStringList{"holdings[3]:", "\"ALPHA\" is already held"};
    QTest::newRow("price zero") << edit([&](QJsonObject &o) { price(o, 5, 2, 0.0); }) << V
                                << QStringList{"prices.rows[5][2] (GAMMA, Ltd on ", "greater than zero, found 0"};
    QTest::newRow("price negative") << edit([&](QJsonObject &o) { price(o, 7, 0, -3.5); }) << V
                                    << QStringList{"prices.rows[7][0] (ALPHA on ", "found -3.5"};
    QTest::newRow("price subnormal") << edit([&](QJsonObject &o) { price(o, 6, 3, 5e-324); }) << V
                                     << QStringList{"prices.rows[6][3] (DELTA/Ü on ", "subnormal"};
    QTest::newRow("price ratio overflows") << edit([&](QJsonObject &o) {
        price(o, 8, 0, 1e-300);
        price(o, 9, 0, 1e300);
    }) << V << QStringList{"prices.rows[9][0] (ALPHA on ", "overflows"};
    QTest::newRow("price null") << edit([&](QJsonObject &o) { price(o, 1, 1, QJsonValue::Null); }) << F
                                << QStringList{"prices.rows[1][1]", "expected a price (a number), found null"};
    QTest::newRow("price too big for a double")
        << QByteArray(R"({"kind": "tailwise-workbook", "format": 1, "title": "", "prices": {"rows": [[1e999]]}})")
        << F << QStringList{"malformed", "illegal number"};
    QTest::newRow("row too short") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            QJsonArray rows = p["rows"].toArray();
            QJsonArray r = rows[9].toArray();
            r.removeLast();
            rows[9] = r;
            p["rows"] = rows;
        });
    }) << F << QStringList{"prices.rows[9]: expected 4 prices (one per asset), found 3"};
    QTest::newRow("dates not increasing") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            QJsonArray d = p["dates"].toArray();
            d[4] = d[3];
            p["dates"] = d;
        });
    }) << F << QStringList{"prices.dates[4]: dates must strictly increase"};
    QTest::newRow("not a date") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            QJsonArray d = p["dates"].toArray();
            d[0] = "2024-02-30";
            p["dates"] = d;
        });
    }) << F << QStringList{"prices.dates[0]: expected a date as \"YYYY-MM-DD\", found \"2024-02-30\""};
    QTest::newRow("rows and dates disagree") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            QJsonArray rows = p["rows"].toArray();
            rows.removeLast();
            p["rows"] = rows;
        });
    }) << F << QStringList{"prices.rows: expected one row of prices per date (40), found 39"};
    QTest::newRow("asset named twice") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            QJsonArray a = p["assets"].toArray();
            a[1] = "ALPHA";
            p["assets"] = a;
        });
    }) << R << QStringList{"prices.assets[1]: the asset \"ALPHA\" appears twice"};
    QTest::newRow("too few dates") << edit([&](QJsonObject &o) {
        inObject(o, "prices", [](QJsonObject &p) {
            p["dates"] = QJsonArray{"2024-01-02", "2024-01-03"};
            p["rows"] = QJsonArray{QJsonArray{1, 2, 3, 4}, QJsonArray{1, 2, 3, 4}};
        });
    }) << D << QStringList{"prices.dates: only 2 dates"};
    QTest::newRow("confidence out of range")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["confidence"] = 1.5; }); }) << A
        << QStringList{"assumptions.confidence: expected a level from 0.5 to 0.9999", "1.5"};
    QTest::newRow("horizon not whole")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["horizon"] = 2.5; }); }) << V
        << QStringList{"assumptions.horizon: expected a whole number, found 2.5"};
    QTest::newRow("horizon zero")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["horizon"] = 0; }); }) << A
        << QStringList{"assumptions.horizon: expected a whole number of trading days of at least 1"};
    QTest::newRow("unknown model")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["model"] = "crystal-ball"; }); })
        << V << QStringList{"assumptions.model: expected \"normal\"", "found \"crystal-ball\""};
    // What a figure is (its confidence and horizon) is never guessed.
    QTest::newRow("confidence missing")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a.remove("confidence"); }); }) << F
        << QStringList{"assumptions.confidence: missing"};
    QTest::newRow("horizon missing")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a.remove("horizon"); }); }) << F
        << QStringList{"assumptions.horizon: missing"};
    QTest::newRow("lambda present but wrong")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["lambda"] = "high"; }); }) << F
        << QStringList{"assumptions.lambda: expected a number, found a string"};
    QTest::newRow("window neither number nor all")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["window"] = "most"; }); }) << F
        << QStringList{"assumptions.window: expected a whole number of days or \"all\""};
    QTest::newRow("dof at 2")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["dof"] = 2; }); }) << A
        << QStringList{"assumptions.dof: expected degrees of freedom greater than 2"};
    QTest::newRow("scaling unknown")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["scaling"] = "cube-root"; }); })
        << V << QStringList{"assumptions.scaling: expected \"sqrt\" or \"aggregate\", found \"cube-root\""};
    QTest::newRow("scaling not text")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["scaling"] = 2; }); }) << F
        << QStringList{"assumptions.scaling: expected \"sqrt\" or \"aggregate\""};
    QTest::newRow("seed negative")
        << edit([&](QJsonObject &o) { inObject(o, "assumptions", [](QJsonObject &a) { a["seed"] = "-1"; }); }) << V
        << QStringList{"assumptions.seed: expected a whole number"};
    for (const char *code : {"eur", "EURO", "E1R", " EUR", "€"})
        QTest::newRow(qPrintable(QStringLiteral("currency %1").arg(QString::fromUtf8(code))))
            << edit([&](QJsonObject &o) { o["currency"] = QString::fromUtf8(code); }) << V
            << QStringList{"currency: expected a currency code of three capital letters"};
    QTest::newRow("currency not text") << edit([](QJsonObject &o) { o["currency"] = 978; }) << F
                                       << QStringList{"currency: expected"};
    QTest::newRow("assumptions not an object") << edit([](QJsonObject &o) { o["assumptions"] = 3; }) << F
                                               << QStringList{"assumptions: expected an object, found 3"};
}

void TestWorkbookFile::refusesBadFiles()
{
    QFETCH(QByteArray, bytes);
    QFETCH(int, kind);
    QFETCH(QStringList, mentions);
    const auto result = parseWorkbookJson(bytes, QStringLiteral("bad.tailwise"));
    QVERIFY2(!result.ok(), "a bad workbook was accepted");
    const Error &e = result.error();
    TW_MESSAGE_HAS(e.message, QStringLiteral("bad.tailwise"));
    for (const QString &m : mentions)
        TW_MESSAGE_HAS(e.message, m);
    QCOMPARE(static_cast<int>(e.kind), kind);
    QCOMPARE(e.file, std::string("bad.tailwise"));
}

void TestWorkbookFile::refusesTruncatedFiles()
{
    const QByteArray good = toBytes(asObject(sampleContents()));
    // Cut anywhere (a copy or a download that stopped): always refused, with the place.
    for (const double fraction : {0.01, 0.25, 0.5, 0.9, 0.999}) {
        const QByteArray cut = good.left(static_cast<qsizetype>(good.size() * fraction));
        const auto result = parseWorkbookJson(cut, QStringLiteral("cut.tailwise"));
        QVERIFY2(!result.ok(), qPrintable(QStringLiteral("accepted at %1").arg(fraction)));
        TW_MESSAGE_HAS(result.error().message, QStringLiteral("cut.tailwise, line "));
        TW_MESSAGE_HAS(result.error().message, QStringLiteral("may be truncated"));
        QVERIFY(result.error().line > 0);
    }
}

void TestWorkbookFile::refusesMissingAndFolderPaths()
{
    QTemporaryDir dir;
    const QString missing = dir.filePath(QStringLiteral("nowhere.tailwise"));
    auto r = loadWorkbook(missing);
    QVERIFY(!r.ok());
    TW_MESSAGE_HAS(r.error().message, missing + QStringLiteral(": the file does not exist"));
    QCOMPARE(r.error().kind, ErrorKind::FileUnreadable);
    r = loadWorkbook(dir.path());
    QVERIFY(!r.ok());
    TW_MESSAGE_HAS(r.error().message, QStringLiteral("this is a folder, not a file"));
}

void TestWorkbookFile::failedSaveKeepsThePreviousFile()
{
    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("kept.tailwise"));
    QVERIFY(saveWorkbook(sampleContents(), path).ok());
    const QByteArray before = readAll(path);
    QVERIFY(!before.isEmpty());

    // Contents that could not be read back are refused before anything is written.
    WorkbookContents bad = sampleContents();
    bad.prices.prices(2, 1) = std::numeric_limits<double>::quiet_NaN();
    auto s = saveWorkbook(bad, path);
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, path + QStringLiteral(": not saved: prices.rows[2][1]"));
    QCOMPARE(readAll(path), before);

    bad = sampleContents();
    bad.holdings[0].asset = "GONE";
    s = saveWorkbook(bad, path);
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, QStringLiteral("not saved: holdings[0]: the asset \"GONE\""));
    QCOMPARE(readAll(path), before);

    // A folder that does not exist; a folder in the file's place.
    const QString noFolder = dir.filePath(QStringLiteral("no/such/folder/x.tailwise"));
    s = saveWorkbook(sampleContents(), noFolder);
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, noFolder + QStringLiteral(": not saved: the folder"));
    TW_MESSAGE_HAS(s.error().message, QStringLiteral("does not exist"));
    s = saveWorkbook(sampleContents(), dir.path());
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, QStringLiteral("this is a folder, not a file"));

    // A save that fails at the last step (renaming into place): a name of 250 bytes exists, but
    // the temporary name beside it would pass the 255-byte limit of a file name on Linux file
    // systems. The previous file must be untouched and no temporary file left behind.
    const QString longPath = dir.filePath(QString(250, QLatin1Char('w')));
    {
        QFile f(longPath);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write("previous contents");
    }
    s = saveWorkbook(sampleContents(), longPath);
    if (s.ok())
        QSKIP("this file system takes long temporary names; the final-step failure was not reached");
    TW_MESSAGE_HAS(s.error().message, longPath + QStringLiteral(": not saved"));
    QCOMPARE(readAll(longPath), QByteArray("previous contents"));
    QCOMPARE(QDir(dir.path()).entryList(QDir::Files | QDir::Hidden).size(), qsizetype(2));
}

void TestWorkbookFile::saveIntoReadOnlyFolderFails()
{
    if (::geteuid() == 0)
        QSKIP("running as root, which may write into a read-only folder; covered by the other save failures");
    QTemporaryDir dir;
    const QString folder = dir.filePath(QStringLiteral("locked"));
    QVERIFY(QDir().mkpath(folder));
    const QString path = folder + QStringLiteral("/kept.tailwise");
    QVERIFY(saveWorkbook(sampleContents(), path).ok());
    const QByteArray before = readAll(path);
    QVERIFY(QFile::setPermissions(folder, QFileDevice::ReadOwner | QFileDevice::ExeOwner));
    WorkbookContents changed = sampleContents();
    changed.title = QStringLiteral("changed");
    const auto s = saveWorkbook(changed, path);
    QFile::setPermissions(folder, QFileDevice::ReadOwner | QFileDevice::WriteOwner | QFileDevice::ExeOwner);
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, path + QStringLiteral(": not saved"));
    QCOMPARE(readAll(path), before);
}

void TestWorkbookFile::saveWhereNoOneMayWriteFails()
{
    // The read-only folder above is skipped as root (root writes there anyway); inside /proc no
    // file can be made, whoever asks, so this failure is reached on every Linux machine.
    if (!QDir(QStringLiteral("/proc/self")).exists())
        QSKIP("needs Linux's /proc");
    const QString path = QStringLiteral("/proc/self/workbook.tailwise");
    const auto s = saveWorkbook(sampleContents(), path);
    QVERIFY(!s.ok());
    TW_MESSAGE_HAS(s.error().message, path + QStringLiteral(": not saved: the file cannot be written"));
    TW_MESSAGE_HAS(s.error().message, QStringLiteral("(an existing file there is unchanged)"));
    QVERIFY(!QFile::exists(path));
}

void TestWorkbookFile::sampleWorkbookMatchesItsCsvs()
{
    // samples/larchmere.tailwise is built from samples/prices.csv and samples/holdings.csv by
    // `tailwise-cli pack` (samples/README.md): it must hold exactly what they hold.
    const QString dir = QStringLiteral(TAILWISE_SOURCE_DIR "/samples/");
    if (!QFile::exists(dir + QStringLiteral("larchmere.tailwise")))
        QSKIP("samples/larchmere.tailwise is not there yet");
    const auto wb = loadWorkbook(dir + QStringLiteral("larchmere.tailwise"));
    QVERIFY2(wb.ok(), wb.ok() ? "" : wb.error().message.c_str());
    const auto prices = readPriceCsv((dir + QStringLiteral("prices.csv")).toStdString());
    QVERIFY(prices.ok());
    const auto holdings = readHoldingsCsv((dir + QStringLiteral("holdings.csv")).toStdString(), &prices.value());
    QVERIFY(holdings.ok());
    WorkbookContents want;
    want.title = QStringLiteral("Larchmere Balanced Fund");
    want.currency = QStringLiteral("EUR"); // the invented fund is in euros (samples/README.md)
    want.prices = prices.value();
    want.holdings = holdings.value();
    want.assumptions = wb.value().assumptions; // checked by the command-line tests
    compareContents(wb.value(), want);
    QCOMPARE(wb.value().assumptions.horizonDays, 10);
    QCOMPARE(wb.value().assumptions.confidence, 0.99);
    QCOMPARE(wb.value().assumptions.window, std::optional<int>(500));
    QCOMPARE(wb.value().assumptions.estimator, CovarianceEstimator::Sample);
}

void TestWorkbookFile::desktopFilesNameTheWorkbookType()
{
    // resources/: the MIME type, its glob, the .desktop entry and the icon must agree with the
    // names the program uses (workbookfile.h), or a double-click would not open a workbook.
    const QString dir = QStringLiteral(TAILWISE_SOURCE_DIR "/resources/");
    const QString mimeType = QLatin1String(workbookMimeType);

    QFile mime(dir + QStringLiteral("tailwise-workbook.xml"));
    QVERIFY(mime.open(QIODevice::ReadOnly));
    QXmlStreamReader xml(&mime);
    QStringList types, globs;
    while (!xml.atEnd()) {
        if (xml.readNext() != QXmlStreamReader::StartElement)
            continue;
        if (xml.name() == QLatin1String("mime-type"))
            types << xml.attributes().value(QLatin1String("type")).toString();
        if (xml.name() == QLatin1String("glob"))
            globs << xml.attributes().value(QLatin1String("pattern")).toString();
    }
    QVERIFY2(!xml.hasError(), qPrintable(xml.errorString()));
    QCOMPARE(types, QStringList{mimeType});
    QCOMPARE(globs, QStringList{QStringLiteral("*.") + QLatin1String(workbookSuffix)});

    QFile desktop(dir + QStringLiteral("tailwise.desktop"));
    QVERIFY(desktop.open(QIODevice::ReadOnly | QIODevice::Text));
    const QStringList lines = QString::fromUtf8(desktop.readAll()).split(QLatin1Char('\n'));
    QCOMPARE(lines.value(0), QStringLiteral("[Desktop Entry]"));
    QVERIFY(lines.contains(QStringLiteral("Exec=tailwise %f")));
    QVERIFY(lines.contains(QStringLiteral("Icon=tailwise")));
    QVERIFY(lines.contains(QStringLiteral("MimeType=") + mimeType + QLatin1Char(';')));

    // The icon named there is installed as tailwise.svg; it must be well-formed SVG.
    QFile icon(dir + QStringLiteral("tailwise.svg"));
    QVERIFY(icon.open(QIODevice::ReadOnly));
    QXmlStreamReader svg(&icon);
    QVERIFY(svg.readNextStartElement());
    QCOMPARE(svg.name().toString(), QStringLiteral("svg"));
    while (!svg.atEnd())
        svg.readNext();
    QVERIFY2(!svg.hasError(), qPrintable(svg.errorString()));
}

QTEST_GUILESS_MAIN(TestWorkbookFile)
#include "test_workbookfile.moc"
