#include "workbookfile.h"
#include "workbookfileinternal.h"

#include "currencycode.h"

#include "tailwise/backtest.h"
#include "tailwise/date.h"
#include "tailwise/limits.h"
#include "tailwise/pricecheck.h"
#include "tailwise/textlimits.h"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QJsonParseError>
#include <QJsonValue>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <optional>
#include <string>
#include <unordered_set>

namespace tailwise::ui {

namespace {

// A workbook embeds a price history, so it may be as large as a price CSV may be.
constexpr qint64 maxWorkbookBytes = static_cast<qint64>(tailwise::PriceLimits::maxFileBytes);
constexpr qsizetype maxHoldings = 100000; // as for a holdings CSV
constexpr double largestExactWhole = 9007199254740992.0; // 2^53: beyond it a double skips integers

using detail::assumptionsJson;
using detail::text;

std::string shortest(double v)
{
    if (std::isnan(v))
        return "not a number";
    if (std::isinf(v))
        return v > 0 ? "infinity" : "-infinity";
    char buffer[32];
    const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, v);
    return ec == std::errc() ? std::string(buffer, end) : std::string("a number");
}

// What a JSON value is, for the "found …" of a message.
std::string describe(const QJsonValue &v)
{
    switch (v.type()) {
    case QJsonValue::Null: return "null";
    case QJsonValue::Bool: return v.toBool() ? "true" : "false";
    case QJsonValue::Double: return shortest(v.toDouble());
    case QJsonValue::String: {
        QString s = v.toString();
        if (s.size() > 40)
            s = s.left(40) + QStringLiteral("…");
        return "a string (\"" + text(s) + "\")";
    }
    case QJsonValue::Array: return "a list";
    case QJsonValue::Object: return "an object";
    case QJsonValue::Undefined: break;
    }
    return "nothing";
}

// "<file>: <json path>: <what>", the place first as in core's fileError/fieldError.
Error placeError(ErrorKind kind, const std::string &source, const std::string &path, const std::string &what)
{
    Error error;
    error.kind = kind;
    error.file = source;
    error.field = path;
    error.message = (source.empty() ? std::string("workbook") : source) + ": "
        + (path.empty() ? std::string() : path + ": ") + what;
    return error;
}

// The first problem found while reading; later reads do nothing once there is one, so that a
// reader is one line per field and one check at the end.
struct Context {
    std::string source;
    std::optional<Error> problem;

    bool ok() const { return !problem; }
    void fail(ErrorKind kind, const std::string &path, const std::string &what)
    {
        if (!problem)
            problem = placeError(kind, source, path, what);
    }
};

std::string member(const std::string &path, const char *key) { return path.empty() ? key : path + "." + key; }
std::string element(const std::string &path, qsizetype index) { return path + "[" + std::to_string(index) + "]"; }

// --- Values ---

bool readNumber(const QJsonValue &v, const std::string &path, Context &c, double &out, const char *what = "a number")
{
    if (!c.ok())
        return false;
    if (!v.isDouble()) {
        c.fail(ErrorKind::Format, path, std::string("expected ") + what + ", found " + describe(v));
        return false;
    }
    const double d = v.toDouble();
    if (!std::isfinite(d)) {
        c.fail(ErrorKind::Value, path, std::string("expected ") + what + " (finite), found " + shortest(d));
        return false;
    }
    out = d;
    return true;
}

bool readWhole(const QJsonValue &v, const std::string &path, Context &c, int &out, const char *what = "a whole number")
{
    double d = 0.0;
    if (!readNumber(v, path, c, d, what))
        return false;
    if (std::floor(d) != d || d < std::numeric_limits<int>::min() || d > std::numeric_limits<int>::max()) {
        c.fail(ErrorKind::Value, path, std::string("expected ") + what + ", found " + shortest(d));
        return false;
    }
    out = static_cast<int>(d);
    return true;
}

bool readText(const QJsonValue &v, const std::string &path, Context &c, std::string &out, const char *what = "a text")
{
    if (!c.ok())
        return false;
    if (!v.isString()) {
        c.fail(ErrorKind::Format, path, std::string("expected ") + what + ", found " + describe(v));
        return false;
    }
    out = text(v.toString());
    return true;
}

// Reads the members of one JSON object by key; a missing key is a problem named by its path.
class ObjectReader {
public:
    ObjectReader(const QJsonObject &object, std::string path, Context &context)
        : m_object(object), m_path(std::move(path)), m_c(context) {}

    bool has(const char *key) const { return m_object.contains(QLatin1String(key)); }
    std::string pathOf(const char *key) const { return member(m_path, key); }

    QJsonValue get(const char *key)
    {
        const QJsonValue v = m_object.value(QLatin1String(key));
        if (v.isUndefined())
            m_c.fail(ErrorKind::Format, pathOf(key), "missing: expected this field");
        return v;
    }
    void number(const char *key, double &out) { readNumber(get(key), pathOf(key), m_c, out); }
    void whole(const char *key, int &out) { readWhole(get(key), pathOf(key), m_c, out); }
    void string(const char *key, std::string &out) { readText(get(key), pathOf(key), m_c, out); }
    void string(const char *key, QString &out)
    {
        std::string s;
        if (readText(get(key), pathOf(key), m_c, s))
            out = QString::fromStdString(s);
    }
    // A name of an enum, through core's parser of that name.
    template <class E>
    void choice(const char *key, E &out, std::optional<E> (*parse)(std::string_view), const char *expected)
    {
        std::string name;
        if (!readText(get(key), pathOf(key), m_c, name, expected))
            return;
        if (const auto v = parse(name))
            out = *v;
        else
            m_c.fail(ErrorKind::Value, pathOf(key), std::string("expected ") + expected + ", found \"" + name + "\"");
    }
    // A whole number, or "all" for none.
    void wholeOrAll(const char *key, std::optional<int> &out)
    {
        const QJsonValue v = get(key);
        if (v.isString() && v.toString() == QLatin1String("all")) {
            out.reset();
            return;
        }
        int n = 0;
        if (readWhole(v, pathOf(key), m_c, n, "a whole number of days or \"all\""))
            out = n;
    }
    void degreesOfFreedom(const char *key, DegreesOfFreedom &out)
    {
        const QJsonValue v = get(key);
        if (v.isString() && v.toString() == QLatin1String("unset")) {
            out = DegreesOfFreedom{};
            return;
        }
        if (v.isString() && v.toString() == QLatin1String("fit")) {
            out = DegreesOfFreedom::fit();
            return;
        }
        double nu = 0.0;
        if (readNumber(v, pathOf(key), m_c, nu, "degrees of freedom (a number), \"fit\" or \"unset\""))
            out = DegreesOfFreedom::given(nu);
    }
    // 64 bits: a decimal string, or a whole JSON number that a double holds exactly.
    void unsigned64(const char *key, std::uint64_t &out)
    {
        const QJsonValue v = get(key);
        const char *what = "a whole number 0 … 18446744073709551615 as a decimal string";
        if (!m_c.ok())
            return;
        if (v.isDouble()) {
            const double d = v.toDouble();
            if (std::isfinite(d) && d >= 0 && std::floor(d) == d && d <= largestExactWhole) {
                out = static_cast<std::uint64_t>(d);
                return;
            }
            m_c.fail(ErrorKind::Value, pathOf(key), std::string("expected ") + what + ", found " + describe(v));
            return;
        }
        std::string s;
        if (!readText(v, pathOf(key), m_c, s, what))
            return;
        std::uint64_t n = 0;
        const auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), n);
        if (s.empty() || ec != std::errc() || end != s.data() + s.size())
            m_c.fail(ErrorKind::Value, pathOf(key), std::string("expected ") + what + ", found " + describe(v));
        else
            out = n;
    }
    QJsonArray array(const char *key)
    {
        const QJsonValue v = get(key);
        if (m_c.ok() && !v.isArray())
            m_c.fail(ErrorKind::Format, pathOf(key), "expected a list, found " + describe(v));
        return v.toArray();
    }
    QJsonObject object(const char *key)
    {
        const QJsonValue v = get(key);
        if (m_c.ok() && !v.isObject())
            m_c.fail(ErrorKind::Format, pathOf(key), "expected an object, found " + describe(v));
        return v.toObject();
    }

private:
    const QJsonObject &m_object;
    std::string m_path;
    Context &m_c;
};

// --- Assumptions: one line per field of tailwise::Assumptions, in both directions. A new field
// gets one line in readAssumptions below and one in workbookwriter.cpp's assumptionsJson (and
// its name in workbookfile.h). ---

// Required: confidence and horizon, which say what a figure is ("99 % over 10 days"); a file
// without them would show a different figure without saying so. Every other field takes its
// default from tailwise::Assumptions when absent (a file written before the field existed, or by
// hand), and the defaults used travel as a warning. A present field is checked as ever.
void readAssumptions(const QJsonObject &o, Context &c, Assumptions &a, Warnings &warnings)
{
    const std::string path = "assumptions";
    ObjectReader r(o, path, c);
    std::vector<std::string> defaulted;
    auto present = [&](const char *key) {
        if (r.has(key))
            return true;
        defaulted.push_back(key);
        return false;
    };
    r.number("confidence", a.confidence);
    r.whole("horizon", a.horizonDays);
    if (present("days-per-year"))
        r.whole("days-per-year", a.daysPerYear);
    if (present("window"))
        r.wholeOrAll("window", a.window);
    if (present("returns"))
        r.choice("returns", a.returns, parseReturnType, "\"simple\" or \"log\"");
    if (present("estimator"))
        r.choice("estimator", a.estimator, parseEstimator, "\"sample\" or \"ewma\"");
    if (present("lambda"))
        r.number("lambda", a.lambda);
    if (present("mean"))
        r.choice("mean", a.mean, parseMeanModel, "\"zero\" or \"sample\"");
    if (present("model"))
        r.choice("model", a.model, parseRiskModel,
                 "\"normal\", \"student-t\", \"cornish-fisher\", \"historical\" or \"monte-carlo\"");
    if (present("dof"))
        r.degreesOfFreedom("dof", a.dof);
    if (present("historical-horizon"))
        r.choice("historical-horizon", a.historicalHorizon, parseHistoricalHorizon, "\"sqrt\" or \"overlapping\"");
    if (present("scaling"))
        r.choice("scaling", a.scaling, parseMultiDayScaling, "\"sqrt\" or \"aggregate\"");
    if (present("simulations"))
        r.whole("simulations", a.simulations);
    if (present("seed"))
        r.unsigned64("seed", a.seed);
    if (c.ok() && !defaulted.empty()) {
        // Name each default with its value, from the writer itself, so the two cannot disagree.
        const QJsonObject defaults = assumptionsJson(Assumptions{});
        std::string list;
        for (const std::string &key : defaulted) {
            const QJsonValue v = defaults.value(QString::fromStdString(key));
            const double d = v.toDouble();
            const std::string value = v.isString()                            ? text(v.toString())
                : std::floor(d) == d && std::abs(d) < largestExactWhole ? std::to_string(static_cast<long long>(d))
                                                                        : shortest(d);
            list += (list.empty() ? "" : ", ") + key + " " + value;
        }
        warnings.push_back(c.source + ": the file does not give these assumptions, so their defaults apply: " + list);
    }
    if (!c.ok())
        return;
    // The same domain checks as every other way in (CLI options, the window's fields).
    if (const auto valid = validate(a); !valid) {
        const Error &e = valid.error();
        std::string what = e.message;
        if (!e.field.empty() && what.rfind(e.field + ": ", 0) == 0)
            what.erase(0, e.field.size() + 2);
        c.fail(ErrorKind::Assumption, e.field.empty() ? path : member(path, e.field.c_str()), what);
    }
}

// --- Backtest settings (optional: a workbook without them reads as it did) ---

void readBacktest(const QJsonObject &o, Context &c, BacktestSettings &b)
{
    const std::string path = "backtest";
    ObjectReader r(o, path, c);
    r.whole("window", b.window);
    if (c.ok() && b.window < 2)
        return c.fail(ErrorKind::Assumption, r.pathOf("window"),
                      "expected a window of at least 2 returns, found " + std::to_string(b.window));
    r.number("test-size", b.testSize);
    if (c.ok() && !(b.testSize > 0.0 && b.testSize < 1.0))
        return c.fail(ErrorKind::Assumption, r.pathOf("test-size"),
                      "expected a test size between 0 and 1 (e.g. 0.05), found " + shortest(b.testSize));
    const QJsonArray models = r.array("models");
    if (!c.ok())
        return;
    if (models.isEmpty())
        return c.fail(ErrorKind::Format, r.pathOf("models"), "expected at least one model");
    b.models.clear();
    for (qsizetype i = 0; i < models.size(); ++i) {
        const std::string at = element(r.pathOf("models"), i);
        std::string name;
        if (!readText(models[i], at, c, name, "a model name"))
            return;
        const auto model = parseRiskModel(name);
        if (!model || !checkBacktestModel(*model).ok()) {
            std::string known;
            for (const RiskModel m : backtestModels())
                known += (known.empty() ? "\"" : ", \"") + std::string(toName(m)) + "\"";
            return c.fail(ErrorKind::Value, at, "expected a model the backtest runs (" + known + "), found \"" + name + "\"");
        }
        if (std::find(b.models.begin(), b.models.end(), *model) != b.models.end())
            return c.fail(ErrorKind::Value, at, "the model \"" + name + "\" appears twice");
        b.models.push_back(*model);
    }
}

// --- Price history ---

// The rules of a price CSV (prices.h), applied to the embedded history.
void readPrices(const QJsonObject &o, Context &c, PriceHistory &h)
{
    const std::string path = "prices";
    ObjectReader r(o, path, c);
    const QJsonArray assets = r.array("assets");
    const QJsonArray dates = r.array("dates");
    const QJsonArray rows = r.array("rows");
    if (!c.ok())
        return;
    if (static_cast<std::size_t>(assets.size()) > PriceLimits::maxAssets)
        return c.fail(ErrorKind::Format, r.pathOf("assets"),
                      "more than " + std::to_string(PriceLimits::maxAssets) + " assets: over the limit");
    if (static_cast<std::size_t>(dates.size()) > PriceLimits::maxRows)
        return c.fail(ErrorKind::Format, r.pathOf("dates"),
                      "more than " + std::to_string(PriceLimits::maxRows) + " dates: over the limit");

    std::unordered_set<std::string> seen;
    for (qsizetype i = 0; i < assets.size(); ++i) {
        const std::string at = element(r.pathOf("assets"), i);
        std::string name;
        if (!readText(assets[i], at, c, name, "an asset name"))
            return;
        if (name.empty())
            return c.fail(ErrorKind::Format, at, "expected an asset name, found an empty text");
        if (const auto problem = checkText(name, maxNameChars))
            return c.fail(ErrorKind::Format, at, describeTextProblem(*problem, "the asset name", maxNameChars));
        if (!seen.insert(name).second)
            return c.fail(ErrorKind::Reference, at, "the asset \"" + name + "\" appears twice");
        h.assets.push_back(std::move(name));
    }
    for (qsizetype i = 0; i < dates.size(); ++i) {
        const std::string at = element(r.pathOf("dates"), i);
        std::string iso;
        if (!readText(dates[i], at, c, iso, "a date as \"YYYY-MM-DD\""))
            return;
        const auto date = parseIsoDate(iso);
        if (!date)
            return c.fail(ErrorKind::Format, at, "expected a date as \"YYYY-MM-DD\", found \"" + iso + "\"");
        if (!h.dates.empty() && *date <= h.dates.back())
            return c.fail(ErrorKind::Format, at,
                          "dates must strictly increase: " + iso + " does not come after " + toIso(h.dates.back()));
        h.dates.push_back(*date);
    }
    if (rows.size() != dates.size())
        return c.fail(ErrorKind::Format, r.pathOf("rows"),
                      "expected one row of prices per date (" + std::to_string(dates.size()) + "), found "
                          + std::to_string(rows.size()));
    if (assets.isEmpty() && dates.isEmpty())
        return; // a workbook without data yet
    if (assets.isEmpty())
        return c.fail(ErrorKind::Format, r.pathOf("assets"), "expected at least one asset for the dates given");
    if (dates.size() < 3)
        return c.fail(ErrorKind::InsufficientData, r.pathOf("dates"),
                      "only " + std::to_string(dates.size()) + " dates of prices: expected at least 3 to estimate anything");

    const qsizetype n = assets.size();
    h.prices.resize(static_cast<Eigen::Index>(rows.size()), static_cast<Eigen::Index>(n));
    for (qsizetype i = 0; i < rows.size(); ++i) {
        const std::string at = element(r.pathOf("rows"), i);
        if (!rows[i].isArray())
            return c.fail(ErrorKind::Format, at, "expected a list of prices, found " + describe(rows[i]));
        const QJsonArray row = rows[i].toArray();
        if (row.size() != n)
            return c.fail(ErrorKind::Format, at,
                          "expected " + std::to_string(n) + " prices (one per asset), found " + std::to_string(row.size()));
        for (qsizetype a = 0; a < n; ++a) {
            const std::string cell = element(at, a) + " (" + h.assets[static_cast<std::size_t>(a)] + " on "
                + toIso(h.dates[static_cast<std::size_t>(i)]) + ")";
            double price = 0.0;
            if (!readNumber(row[a], cell, c, price, "a price (a number)"))
                return;
            if (price <= 0.0)
                return c.fail(ErrorKind::Value, cell, "expected a price greater than zero, found " + shortest(price));
            h.prices(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(a)) = price;
        }
    }
    // A subnormal price, or a ratio to the previous day that overflows, leaves no usable return
    // (pricecheck.h): refused here as the price reader refuses it in a CSV.
    if (const auto bad = findUnusablePrice(h.prices)) {
        const std::string cell = element(element(r.pathOf("rows"), static_cast<qsizetype>(bad->row)),
                                         static_cast<qsizetype>(bad->asset))
            + " (" + h.assets[bad->asset] + " on " + toIso(h.dates[bad->row]) + ")";
        return c.fail(ErrorKind::Value, cell, "the price " + bad->why);
    }
}

// --- Holdings ---

void readHoldings(const QJsonArray &list, const PriceHistory &prices, Context &c, Holdings &holdings)
{
    const std::string path = "holdings";
    if (list.size() > maxHoldings)
        return c.fail(ErrorKind::Format, path, "more than " + std::to_string(maxHoldings) + " holdings: over the limit");
    for (qsizetype i = 0; i < list.size() && c.ok(); ++i) {
        const std::string at = element(path, i);
        if (!list[i].isObject())
            return c.fail(ErrorKind::Format, at,
                          "expected an object with an \"asset\" and a \"quantity\" or \"value\", found " + describe(list[i]));
        const QJsonObject o = list[i].toObject();
        ObjectReader r(o, at, c);
        Holding h;
        r.string("asset", h.asset);
        if (c.ok() && h.asset.empty())
            return c.fail(ErrorKind::Format, r.pathOf("asset"), "expected an asset name, found an empty text");
        if (!r.has("quantity") && !r.has("value"))
            return c.fail(ErrorKind::Format, at, "expected a \"quantity\" or a \"value\"");
        if (r.has("quantity"))
            r.number("quantity", h.quantity);
        // Both is ambiguous (which one counts?): refused. A quantity of 0 beside a value is what
        // earlier versions wrote for a holding given by value, and is read as that value.
        if (c.ok() && r.has("quantity") && r.has("value") && h.quantity != 0.0)
            return c.fail(ErrorKind::Format, at,
                          "has both a \"quantity\" and a \"value\": give one (a number of units, or a money value)");
        if (r.has("price")) {
            double p = 0.0;
            r.number("price", p);
            if (c.ok() && p <= 0.0)
                return c.fail(ErrorKind::Value, r.pathOf("price"), "expected a price greater than zero, found " + shortest(p));
            h.priceOverride = p;
        }
        if (r.has("value")) {
            double v = 0.0;
            r.number("value", v);
            h.value = v;
        }
        holdings.push_back(std::move(h));
    }
    if (!c.ok())
        return;
    // The same reference rules as everywhere else (every asset known, held once). Core names the
    // holding as "holding N", counted from 1; say it as the JSON path.
    if (const auto checked = checkHoldings(holdings, prices); !checked) {
        const Error &e = checked.error();
        std::string what = e.message;
        std::string place = path;
        if (!e.field.empty() && what.rfind(e.field + ": ", 0) == 0)
            what.erase(0, e.field.size() + 2);
        int row = 0;
        const std::string prefix = "holding ";
        if (e.field.rfind(prefix, 0) == 0) {
            const char *first = e.field.data() + prefix.size();
            const char *last = e.field.data() + e.field.size();
            const auto [end, ec] = std::from_chars(first, last, row);
            if (ec == std::errc() && end == last && row >= 1)
                place = element(path, row - 1);
        }
        c.fail(e.kind, place, what);
    }
}

// --- Stress scenarios (optional: files written before scenarios existed have none) ---

// The rules of a scenario CSV (stress.h): a known asset, once per scenario; a finite shock above −1.
void readScenarios(const QJsonArray &list, const PriceHistory &prices, Context &c, std::vector<StressScenario> &out)
{
    const std::string path = "scenarios";
    std::unordered_set<std::string> names;
    for (qsizetype i = 0; i < list.size() && c.ok(); ++i) {
        const std::string at = element(path, i);
        if (!list[i].isObject())
            return c.fail(ErrorKind::Format, at, "expected an object with a \"name\" and \"shocks\", found " + describe(list[i]));
        const QJsonObject o = list[i].toObject();
        ObjectReader r(o, at, c);
        StressScenario sc;
        r.string("name", sc.name);
        if (c.ok() && sc.name.empty())
            return c.fail(ErrorKind::Format, r.pathOf("name"), "expected a scenario name, found an empty text");
        if (const auto problem = checkText(sc.name, maxNameChars))
            return c.fail(ErrorKind::Format, r.pathOf("name"), describeTextProblem(*problem, "the scenario name", maxNameChars));
        if (c.ok() && !names.insert(sc.name).second)
            return c.fail(ErrorKind::Reference, r.pathOf("name"), "the scenario \"" + sc.name + "\" appears twice");
        const QJsonArray shocks = r.array("shocks");
        std::unordered_set<std::string> assets;
        for (qsizetype k = 0; k < shocks.size() && c.ok(); ++k) {
            const std::string sat = element(r.pathOf("shocks"), k);
            if (!shocks[k].isObject())
                return c.fail(ErrorKind::Format, sat, "expected an object with an \"asset\" and a \"shock\", found "
                                                          + describe(shocks[k]));
            const QJsonObject so = shocks[k].toObject();
            ObjectReader sr(so, sat, c);
            std::string asset;
            double shock = 0.0;
            sr.string("asset", asset);
            sr.number("shock", shock);
            if (!c.ok())
                return;
            if (prices.assetIndex(asset) < 0)
                return c.fail(ErrorKind::Reference, sr.pathOf("asset"), "the asset \"" + asset + "\" is not in the price history");
            if (!assets.insert(asset).second)
                return c.fail(ErrorKind::Reference, sr.pathOf("asset"), "the asset \"" + asset + "\" is shocked twice");
            if (shock <= -1.0)
                return c.fail(ErrorKind::Value, sr.pathOf("shock"),
                              "expected a shock above -1 (a price cannot fall to zero or beneath), found " + shortest(shock));
            sc.shocks.emplace_back(std::move(asset), shock);
        }
        out.push_back(std::move(sc));
    }
}

// Line and column (1-based, columns in bytes) of a byte offset, for a JSON syntax error.
std::pair<int, int> lineAndColumn(const QByteArray &bytes, qsizetype offset)
{
    int line = 1, column = 1;
    const qsizetype end = std::min(offset, bytes.size());
    for (qsizetype i = 0; i < end; ++i) {
        if (bytes[i] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
    }
    return {line, column};
}
} // namespace

// --- The whole file ---

Result<WorkbookContents> detail::contentsFromJson(const QJsonObject &root, const std::string &source)
{
    Context c{source, std::nullopt};
    const QJsonValue kind = root.value(QLatin1String("kind"));
    if (!kind.isString() || kind.toString() != QLatin1String(workbookKind))
        return placeError(ErrorKind::Format, source, "",
                          std::string("not a Tailwise workbook: expected \"kind\": \"") + workbookKind + "\", found "
                              + (kind.isUndefined() ? std::string("no \"kind\"") : describe(kind)));
    int format = 0;
    if (!readWhole(root.value(QLatin1String("format")), "format", c, format, "a format version (a whole number)"))
        return *c.problem;
    if (format > workbookFormatVersion)
        return placeError(ErrorKind::Format, source, "",
                          "made by a newer Tailwise (format " + std::to_string(format) + "); this version reads format "
                              + std::to_string(workbookFormatVersion));
    if (format < 1)
        return placeError(ErrorKind::Format, source, "format",
                          "expected a format version of 1 or more, found " + std::to_string(format));

    WorkbookContents contents;
    ObjectReader r(root, "", c);
    if (r.has("title")) {
        std::string title;
        r.string("title", title);
        if (c.ok())
            if (const auto problem = checkText(title, maxTitleChars))
                c.fail(ErrorKind::Format, r.pathOf("title"), describeTextProblem(*problem, "the title", maxTitleChars));
        if (c.ok())
            contents.title = QString::fromStdString(title);
    }
    if (c.ok() && r.has("currency")) {
        // Optional (absent: not stated). "" is taken as not stated too; anything else must be a code.
        QString code;
        r.string("currency", code);
        if (c.ok() && !code.isEmpty() && !isCurrencyCode(code))
            c.fail(ErrorKind::Value, r.pathOf("currency"),
                   "expected a currency code of three capital letters (e.g. EUR, GBP, USD), found \""
                       + code.toStdString() + "\"");
        if (c.ok())
            contents.currency = code;
    }
    const QJsonObject prices = r.object("prices");
    if (c.ok())
        readPrices(prices, c, contents.prices);
    const QJsonArray holdings = r.array("holdings");
    if (c.ok())
        readHoldings(holdings, contents.prices, c, contents.holdings);
    const QJsonObject assumptions = r.object("assumptions");
    if (c.ok())
        readAssumptions(assumptions, c, contents.assumptions, contents.warnings);
    if (c.ok() && r.has("backtest")) {
        const QJsonObject backtest = r.object("backtest");
        BacktestSettings settings;
        if (c.ok())
            readBacktest(backtest, c, settings);
        contents.backtest = settings;
    }
    if (c.ok() && r.has("scenarios")) {
        const QJsonArray scenarios = r.array("scenarios");
        if (c.ok())
            readScenarios(scenarios, contents.prices, c, contents.scenarios);
    }
    if (c.ok() && r.has("limits")) {
        // Optional: each limit in its text form (limits.h); groups are not held yet, so a group is refused.
        const QJsonArray limits = r.array("limits");
        for (qsizetype i = 0; i < limits.size() && c.ok(); ++i) {
            const std::string at = element("limits", i);
            if (!limits[i].isString()) {
                c.fail(ErrorKind::Format, at, "expected a limit such as \"var=250000\", found " + describe(limits[i]));
                break;
            }
            auto limit = parseLimit(limits[i].toString().toStdString(), at);
            if (limit.ok()) {
                if (const auto checked = checkLimits({limit.value()}, {}, at); !checked.ok())
                    limit = checked.error();
            }
            if (!limit.ok()) {
                std::string what = limit.error().message;
                if (what.rfind(at + ": ", 0) == 0)
                    what.erase(0, at.size() + 2);
                c.fail(limit.error().kind, at, what);
                break;
            }
            contents.limits.push_back(limit.value());
        }
    }
    if (!c.ok())
        return *c.problem;
    contents.prices.sourceName = source;
    return contents;
}

Result<WorkbookContents> parseWorkbookJson(const QByteArray &json, const QString &sourceName)
{
    const std::string source = text(sourceName);
    if (json.trimmed().isEmpty())
        return fileError(ErrorKind::Format, source, 0, 0, "the file is empty: expected a Tailwise workbook (JSON)");
    QJsonParseError parseError;
    const QJsonDocument document = QJsonDocument::fromJson(json, &parseError);
    if (parseError.error != QJsonParseError::NoError) {
        const auto [line, column] = lineAndColumn(json, parseError.offset);
        return fileError(ErrorKind::Format, source, line, column,
                         "not a readable workbook: the JSON is malformed near byte " + std::to_string(parseError.offset)
                             + " (" + text(parseError.errorString()) + "); the file may be truncated or damaged");
    }
    if (!document.isObject())
        return placeError(ErrorKind::Format, source, "",
                          std::string("not a Tailwise workbook: expected a JSON object with \"kind\": \"") + workbookKind
                              + "\", found " + (document.isArray() ? "a list" : "something else"));
    return detail::contentsFromJson(document.object(), source);
}

Result<WorkbookContents> loadWorkbook(const QString &path)
{
    const std::string source = text(path);
    const QFileInfo info(path);
    if (!info.exists())
        return fileError(ErrorKind::FileUnreadable, source, 0, 0, "the file does not exist");
    if (info.isDir())
        return fileError(ErrorKind::FileUnreadable, source, 0, 0, "this is a folder, not a file");
    if (info.size() > maxWorkbookBytes)
        return fileError(ErrorKind::FileUnreadable, source, 0, 0,
                         "the file is " + std::to_string(info.size() / (1024 * 1024)) + " MiB, over the limit of "
                             + std::to_string(maxWorkbookBytes / (1024 * 1024)) + " MiB");
    QFile file(path);
    if (!file.open(QIODevice::ReadOnly))
        return fileError(ErrorKind::FileUnreadable, source, 0, 0,
                         "the file cannot be opened for reading (" + text(file.errorString()) + ")");
    const QByteArray bytes = file.read(maxWorkbookBytes + 1);
    if (file.error() != QFileDevice::NoError)
        return fileError(ErrorKind::FileUnreadable, source, 0, 0, "reading failed (" + text(file.errorString()) + ")");
    if (bytes.size() > maxWorkbookBytes)
        return fileError(ErrorKind::FileUnreadable, source, 0, 0, "the file is over the size limit");
    return parseWorkbookJson(bytes, path);
}
} // namespace tailwise::ui
