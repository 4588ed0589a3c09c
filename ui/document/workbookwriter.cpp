#include "workbookfile.h"
#include "workbookfileinternal.h"
#include "savefile.h"

#include "tailwise/backtest.h"
#include "tailwise/date.h"
#include "tailwise/limits.h"

#include <QDir>
#include <QFileInfo>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QJsonValue>

#include <string>

namespace tailwise::ui {

using detail::assumptionsJson;
using detail::contentsFromJson;
using detail::text;

namespace {

// --- Assumptions: one line per field of tailwise::Assumptions, in both directions (readAssumptions
// in workbookreader.cpp reads what assumptionsJson below writes). ---

QJsonValue nameJson(std::string_view name) { return QString::fromUtf8(name.data(), static_cast<qsizetype>(name.size())); }

QJsonValue dofJson(const DegreesOfFreedom &dof)
{
    switch (dof.kind) {
    case DegreesOfFreedom::Kind::Unset: return QStringLiteral("unset");
    case DegreesOfFreedom::Kind::Fit: return QStringLiteral("fit");
    case DegreesOfFreedom::Kind::Given: break;
    }
    return dof.value;
}

} // namespace

QJsonObject detail::assumptionsJson(const Assumptions &a)
{
    QJsonObject o;
    o["confidence"] = a.confidence;
    o["horizon"] = a.horizonDays;
    o["days-per-year"] = a.daysPerYear;
    o["window"] = a.window ? QJsonValue(*a.window) : QJsonValue(QStringLiteral("all"));
    o["returns"] = nameJson(toName(a.returns));
    o["estimator"] = nameJson(toName(a.estimator));
    o["lambda"] = a.lambda;
    o["mean"] = nameJson(toName(a.mean));
    o["model"] = nameJson(toName(a.model));
    o["dof"] = dofJson(a.dof);
    o["historical-horizon"] = nameJson(toName(a.historicalHorizon));
    o["scaling"] = nameJson(toName(a.scaling));
    o["simulations"] = a.simulations;
    o["seed"] = QString::number(a.seed);
    return o;
}

namespace {

// --- Backtest settings ---

QJsonObject backtestJson(const BacktestSettings &b)
{
    QJsonObject o;
    o["window"] = b.window;
    o["test-size"] = b.testSize;
    QJsonArray models;
    for (const RiskModel m : b.models)
        models.append(nameJson(toName(m)));
    o["models"] = models;
    return o;
}

// --- Price history ---

QJsonObject pricesJson(const PriceHistory &h)
{
    QJsonArray assets, dates, rows;
    for (const auto &name : h.assets)
        assets.append(QString::fromStdString(name));
    for (const Date d : h.dates)
        dates.append(QString::fromStdString(toIso(d)));
    for (Eigen::Index r = 0; r < h.prices.rows(); ++r) {
        QJsonArray row;
        for (Eigen::Index a = 0; a < h.prices.cols(); ++a)
            row.append(h.prices(r, a));
        rows.append(row);
    }
    QJsonObject o;
    o["assets"] = assets;
    o["dates"] = dates;
    o["rows"] = rows;
    return o;
}

// --- Holdings ---

QJsonArray holdingsJson(const Holdings &holdings)
{
    QJsonArray list;
    for (const Holding &h : holdings) {
        QJsonObject o;
        o["asset"] = QString::fromStdString(h.asset);
        if (!h.value) // a holding is a quantity or a value, never both (both are refused on reading)
            o["quantity"] = h.quantity;
        if (h.priceOverride)
            o["price"] = *h.priceOverride;
        if (h.value)
            o["value"] = *h.value;
        list.append(o);
    }
    return list;
}

// --- Stress scenarios ---

QJsonArray scenariosJson(const std::vector<StressScenario> &scenarios)
{
    QJsonArray list;
    for (const StressScenario &sc : scenarios) {
        QJsonArray shocks;
        for (const auto &[asset, shock] : sc.shocks) {
            QJsonObject o;
            o["asset"] = QString::fromStdString(asset);
            o["shock"] = shock;
            shocks.append(o);
        }
        QJsonObject o;
        o["name"] = QString::fromStdString(sc.name);
        o["shocks"] = shocks;
        list.append(o);
    }
    return list;
}

// --- The whole file ---

QJsonObject contentsJson(const WorkbookContents &contents, const QJsonObject &extraKeys = {})
{
    QJsonObject root = extraKeys; // the format's own keys below replace any of the same name
    root["kind"] = QLatin1String(workbookKind);
    root["format"] = workbookFormatVersion;
    root["title"] = contents.title;
    // Written only when stated, so that a workbook without one is the same file as before.
    if (!contents.currency.isEmpty())
        root["currency"] = contents.currency;
    root["prices"] = pricesJson(contents.prices);
    root["holdings"] = holdingsJson(contents.holdings);
    root["assumptions"] = assumptionsJson(contents.assumptions);
    if (contents.backtest)
        root["backtest"] = backtestJson(*contents.backtest);
    if (!contents.scenarios.empty())
        root["scenarios"] = scenariosJson(contents.scenarios);
    if (!contents.limits.empty()) {
        QJsonArray limits;
        for (const Limit &l : contents.limits)
            limits.append(QString::fromStdString(limitText(l)));
        root["limits"] = limits;
    }
    return root;
}

// The system's reason, when it gives one.
Error saveError(const QString &path, const std::string &what)
{
    return fileError(ErrorKind::FileUnreadable, text(path), 0, 0,
                     "not saved: " + what + " (an existing file there is unchanged)");
}

} // namespace

Result<QByteArray> workbookJson(const WorkbookContents &contents, const QJsonObject &extraKeys)
{
    const QJsonObject root = contentsJson(contents, extraKeys);
    // Store only what reads back: the reader's rules are the one definition of a valid workbook.
    // (A non-finite number would otherwise become a JSON null.)
    if (auto check = contentsFromJson(root, "workbook"); !check)
        return check.error();
    return QJsonDocument(root).toJson(QJsonDocument::Indented);
}

Status saveWorkbook(const WorkbookContents &contents, const QString &path, const QJsonObject &extraKeys)
{
    const auto json = workbookJson(contents, extraKeys);
    if (!json) {
        Error e = json.error();
        const std::string what = e.message.rfind("workbook: ", 0) == 0 ? e.message.substr(10) : e.message;
        e.message = text(path) + ": not saved: " + what;
        e.file = text(path);
        return e;
    }
    const QFileInfo info(path);
    if (info.isDir())
        return saveError(path, "this is a folder, not a file");
    if (!info.absoluteDir().exists())
        return saveError(path, "the folder " + text(QDir::toNativeSeparators(info.absolutePath())) + " does not exist");
    // One way to write a file (savefile.h): a temporary file, every write, fsync and close checked,
    // then the rename; a full disk or a refused target leaves the old file as it was.
    if (auto saved = saveFile(path, json.value()); !saved) {
        const std::string &message = saved.error().message;
        const std::string prefix = "could not save " + saved.error().file + ": ";
        const std::string why = message.rfind(prefix, 0) == 0 ? message.substr(prefix.size()) : message;
        return saveError(path, "the file cannot be written (" + why + ")");
    }
    return Done{};
}

} // namespace tailwise::ui
