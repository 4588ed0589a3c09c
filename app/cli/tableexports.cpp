#include "tableexports.h"

#include "tailwise/date.h"

namespace tailwise::cli {

namespace {

xlsx::Cell num(std::optional<double> v) { return v ? xlsx::Cell(*v) : xlsx::Cell(); }

} // namespace

std::vector<xlsx::Table> varTables(const RiskReport &r, const ReportExtras &extras)
{
    using xlsx::CellKind;
    std::vector<xlsx::Table> tables;
    xlsx::Table summary{"Summary", {{"figure", CellKind::Text}, {"value", CellKind::Number}, {"unit", CellKind::Text}}, {}};
    const std::string unit = extras.currency.empty() ? std::string("money") : extras.currency;
    auto row = [&](const std::string &name, xlsx::Cell value, const std::string &u) {
        summary.rows.push_back({name, std::move(value), u});
    };
    if (extras.stamp) {
        row("as of", extras.stamp->asOf, "date");
        row("input SHA-256", extras.stamp->inputSha256, "");
        row("Tailwise version", extras.stamp->toolVersion, "");
        if (extras.stamp->seed)
            row("seed", std::to_string(*extras.stamp->seed), "");
    }
    row("portfolio value", r.portfolioValue, unit);
    row("confidence", r.assumptions.confidence, "fraction");
    row("horizon", static_cast<double>(r.assumptions.horizonDays), "trading days");
    row("model", std::string(toName(r.model.used)), "");
    row("Value-at-Risk", r.figures.var, unit);
    row("Expected Shortfall", r.figures.es, unit);
    row("VaR fraction of value", num(r.varFraction), "fraction");
    row("ES fraction of value", num(r.esFraction), "fraction");
    tables.push_back(std::move(summary));

    if (!r.holdings.empty()) {
        xlsx::Table c{"Contributions",
                      {{"asset", CellKind::Text},
                       {"exposure", CellKind::Money},
                       {"weight", CellKind::Percent},
                       {"marginal VaR", CellKind::Number},
                       {"component VaR", CellKind::Money},
                       {"share of VaR", CellKind::Percent},
                       {"component ES", CellKind::Money},
                       {"own VaR", CellKind::Money},
                       {"own ES", CellKind::Money}},
                      {}};
        for (const auto &h : r.holdings)
            c.rows.push_back({h.asset, h.exposure, num(h.weight), h.marginalVar, h.componentVar, num(h.componentShare),
                              h.componentEs, h.standaloneVar, h.standaloneEs});
        tables.push_back(std::move(c));
    }
    if (!extras.limits.empty()) {
        xlsx::Table l{"Limits",
                      {{"measure", CellKind::Text},
                       {"group", CellKind::Text},
                       {"limit", CellKind::Money},
                       {"warning level", CellKind::Percent},
                       {"value", CellKind::Money},
                       {"use", CellKind::Percent},
                       {"state", CellKind::Text}},
                      {}};
        for (const auto &u : extras.limits)
            l.rows.push_back({std::string(toName(u.limit.measure)), u.limit.group.empty() ? std::string("book") : u.limit.group,
                              u.limitMoney, u.limit.warningLevel, u.value, u.use, std::string(toName(u.state))});
        tables.push_back(std::move(l));
    }
    return tables;
}

Status writeVarWorkbook(const std::string &path, const RiskReport &report, const ReportExtras &extras)
{
    return xlsx::writeXlsx(path, varTables(report, extras));
}

std::vector<xlsx::Table> backtestTables(const BacktestResult &result)
{
    using xlsx::CellKind;
    const std::vector<xlsx::Column> columns{{"date", CellKind::Date},
                                            {"pnl", CellKind::Money},
                                            {"var", CellKind::Money},
                                            {"exception", CellKind::Text},
                                            {"loss_beyond_var", CellKind::Money}};
    xlsx::Table exceptions{"Exceptions", columns, {}}, days{"Days", columns, {}};
    for (const auto &d : result.days) {
        std::vector<xlsx::Cell> row{toIso(d.date), d.pnl, d.var, std::string(d.exception ? "yes" : "no"),
                                    d.exception ? xlsx::Cell(-d.pnl - d.var) : xlsx::Cell()};
        if (d.exception)
            exceptions.rows.push_back(row);
        days.rows.push_back(std::move(row));
    }
    return {exceptions, days};
}

std::vector<HistoryRow> historyRows(const std::vector<store::RunRecord> &runs)
{
    std::vector<HistoryRow> rows;
    const store::RunRecord *previous = nullptr;
    for (const auto &run : runs) {
        HistoryRow row;
        row.run = run;
        if (previous && previous->workbook == run.workbook) {
            row.varChange = run.var - previous->var;
            row.esChange = run.es - previous->es;
            if (run.holdingsSha256 != previous->holdingsSha256)
                row.changed.push_back("holdings");
            if (run.pricesSha256 != previous->pricesSha256)
                row.changed.push_back("market data");
            if (run.assumptionsSha256 != previous->assumptionsSha256)
                row.changed.push_back("assumptions");
        }
        for (const auto &l : run.limits) {
            auto rank = [](const std::string &s) { return s == "breached" ? 3 : s == "warning" ? 2 : s == "ok" ? 1 : 0; };
            if (rank(l.state) > rank(row.worstLimitState))
                row.worstLimitState = l.state;
        }
        rows.push_back(std::move(row));
        previous = &run;
    }
    return rows;
}

xlsx::Table historyTable(const std::vector<HistoryRow> &rows)
{
    using xlsx::CellKind;
    xlsx::Table t{"History",
                  {{"workbook", CellKind::Text},
                   {"as_of", CellKind::Date},
                   {"portfolio_value", CellKind::Money},
                   {"var", CellKind::Money},
                   {"es", CellKind::Money},
                   {"realised_pnl", CellKind::Money},
                   {"var_change", CellKind::Money},
                   {"es_change", CellKind::Money},
                   {"changed", CellKind::Text},
                   {"limits_state", CellKind::Text},
                   {"input_sha256", CellKind::Text},
                   {"tool_version", CellKind::Text},
                   {"recorded_at", CellKind::Text}},
                  {}};
    for (const auto &row : rows) {
        std::string changed;
        for (const auto &c : row.changed)
            changed += (changed.empty() ? "" : "; ") + c;
        const auto &r = row.run;
        t.rows.push_back({r.workbook, r.asOf, r.portfolioValue, r.var, r.es, num(r.realisedPnl), num(row.varChange),
                          num(row.esChange), changed, row.worstLimitState, r.inputSha256, r.toolVersion, r.recordedAt});
    }
    return t;
}

} // namespace tailwise::cli
