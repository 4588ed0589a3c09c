#include "reportsections.h"

#include "charts/chartstyle.h"
#include "text/assumptionlabels.h"
#include "text/backtestwords.h"
#include "text/cautions.h"
#include "text/headline.h"
#include "text/limitwords.h"
#include "text/names.h"
#include "text/version.h"
#include "text/numbers.h"

#include "tailwise/inputhash.h"
#include "tailwise/limits.h"
#include "tailwise/modelgrid.h"
#include "tailwise/grid.h"

#include <QCoreApplication>
#include <QLocale>

#include <algorithm>
#include <cmath>
#include <set>

namespace tailwise::ui::report {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("Report", text); }
QString tr(const char *text, int n) { return QCoreApplication::translate("Report", text, nullptr, n); }

QString str(const std::string &s) { return QString::fromStdString(s); }

const QString kDash = QStringLiteral("\u2014");

QString confidence(double c) { return chartstyle::confidenceText(c); }

// The share of value a money figure is, when the value is not zero (as core's fractions).
std::optional<double> shareOf(double money, double value)
{
    if (value == 0.0 || !std::isfinite(money) || !std::isfinite(value))
        return std::nullopt;
    return money / value;
}

QString number(double value, int decimals)
{
    if (!std::isfinite(value))
        return kDash;
    return QLocale().toString(value, 'f', decimals);
}

void addFigure(Document &doc, const ChartFigure &chart)
{
    if (!chart.paint)
        return;
    doc.add(Figure{chart.aspect, chart.paint});
    if (!chart.caption.isEmpty())
        doc.add(TextStyle::Note, chart.caption);
}

QString modelDetail(const RiskReport &r)
{
    const ModelDetails &m = r.model;
    QStringList parts;
    parts << modelLabel(m.used);
    if (m.used != r.assumptions.model)
        parts << tr("(%1 could not be fitted to this window, so the normal model gave the figures)")
                     .arg(modelLabel(r.assumptions.model));
    if (m.dof && std::isfinite(*m.dof))
        parts << (m.dofFitted ? tr("with ν = %1 fitted to the window") : tr("with ν = %1")).arg(number(*m.dof, 2));
    if (m.used == RiskModel::MonteCarlo) {
        parts << tr("with %1 draws, seed %2").arg(QLocale().toString(m.simulations),
                                                  m.seed ? QString::number(*m.seed) : kDash);
    }
    if (m.used == RiskModel::Historical)
        parts << tr("over %1 replayed losses").arg(QLocale().toString(m.scenarios));
    return parts.join(QLatin1Char(' '));
}

} // namespace

std::vector<int> reportHorizons(const Assumptions &a)
{
    std::set<int> days{1, 5, 10, 21, 63, a.daysPerYear, a.horizonDays};
    return {days.begin(), days.end()};
}

std::vector<double> reportConfidences(const Assumptions &a)
{
    std::vector<double> c{0.95, 0.975, 0.99, 0.995, 0.999};
    if (std::none_of(c.begin(), c.end(), [&](double x) { return std::abs(x - a.confidence) < 1e-12; }))
        c.push_back(a.confidence);
    std::sort(c.begin(), c.end());
    return c;
}

void addTitle(Document &doc, const ReportInputs &in)
{
    const QString title = in.contents->title.isEmpty() ? in.workbookName : in.contents->title;
    doc.add(TextStyle::Title, title);
    doc.add(TextStyle::Subheading, tr("Risk report: Value-at-Risk and Expected Shortfall"));
    const QString currency = in.contents->currency.isEmpty()
                                 ? tr("Money is in the portfolio's currency (the workbook does not state which).")
                                 : tr("Money figures are in %1.").arg(in.contents->currency);
    doc.add(TextStyle::Note, tr("Made on %1 from the workbook %2 with Tailwise %3. %4 The figures are estimates "
                                "from past prices under a model, not advice: read the cautions at the end before "
                                "relying on them.")
                                 .arg(QLocale().toString(in.date, QStringLiteral("d MMMM yyyy")), in.workbookName,
                                      QLatin1String(versionText()), currency));
}

// What the figures were made from, as the command line's stamp (`tool_version`, `as_of`, `seed`,
// `input_sha256`: tailwise/inputhash.h): the same inputs give the same digest in both.
struct Stamp {
    QString asOf;   // ISO date: the last day of the price history used
    QString seed;   // Monte Carlo only
    QString sha256; // of the prices, holdings and assumptions
};

Stamp stampOf(const WorkbookContents &c)
{
    Stamp s;
    if (!c.prices.dates.empty())
        s.asOf = str(toIso(c.prices.dates.back()));
    if (c.assumptions.model == RiskModel::MonteCarlo)
        s.seed = QString::number(c.assumptions.seed);
    s.sha256 = str(inputSha256(c.prices, c.holdings, c.assumptions));
    return s;
}

void addStamp(Document &doc, const WorkbookContents &c)
{
    const Stamp s = stampOf(c);
    QString text = tr("Traceable to its inputs: Tailwise %1; as of %2").arg(QLatin1String(versionText()),
                                                                          s.asOf.isEmpty() ? tr("no prices") : s.asOf);
    if (!s.seed.isEmpty())
        text += tr("; Monte Carlo seed %1").arg(s.seed);
    text += tr("; input SHA-256 %1 (of the prices, holdings and assumptions; the command line prints the same "
               "digest for the same workbook).").arg(s.sha256);
    doc.add(TextStyle::Note, text);
    doc.subject = tr("Value-at-Risk and Expected Shortfall report");
    doc.keywords = {QStringLiteral("tool_version=%1").arg(QLatin1String(versionText())),
                    QStringLiteral("as_of=%1").arg(s.asOf), QStringLiteral("input_sha256=%1").arg(s.sha256)};
    if (!s.seed.isEmpty())
        doc.keywords << QStringLiteral("seed=%1").arg(s.seed);
}

void addHeadline(Document &doc, const RiskReport &r)
{
    const Assumptions &a = r.assumptions;
    doc.add(TextStyle::Heading, tr("Headline figures"));
    const QString setting = tr("%1, %2").arg(confidence(a.confidence), tradingDaysText(a.horizonDays));
    KeyFigures figures;
    const QString noShare = tr("no share: the portfolio's value is zero");
    figures.items.push_back({tr("Value-at-Risk"), moneyText(r.figures.var),
                             (r.varFraction ? tr("%1 of the portfolio's value").arg(percentText(r.varFraction)) : noShare)
                                 + QLatin1Char('\n') + setting});
    figures.items.push_back({tr("Expected Shortfall"), moneyText(r.figures.es),
                             (r.esFraction ? tr("%1 of the portfolio's value").arg(percentText(r.esFraction)) : noShare)
                                 + QLatin1Char('\n') + tr("average loss beyond VaR")});
    figures.items.push_back({tr("Portfolio value"), moneyText(r.portfolioValue, 0),
                             tr("%n holdings", static_cast<int>(r.holdings.size())) + QLatin1Char('\n')
                                 + tr("net market value")});
    doc.add(figures);
    doc.add(TextStyle::Body, headlineSentence(r));
    doc.add(TextStyle::Body, tr("Model: %1. %2").arg(modelDetail(r), modelDescription(r.model.used)));
    if (const QString scaling = scalingSentence(r); !scaling.isEmpty())
        doc.add(TextStyle::Body, tr("Longer horizons: %1").arg(scaling));
    if (r.model.varStandardError && std::isfinite(*r.model.varStandardError))
        doc.add(TextStyle::Body, tr("The simulation's standard error is %1 on VaR and %2 on ES: a second run with "
                                    "another seed would differ by about that much.")
                                     .arg(moneyText(*r.model.varStandardError),
                                          r.model.esStandardError ? moneyText(*r.model.esStandardError) : kDash));
    if (!r.warnings.empty()) {
        QStringList notes;
        for (const auto &w : r.warnings)
            notes << str(w);
        doc.add(TextStyle::Note, tr("Notes from the computation: %1.").arg(notes.join(QStringLiteral("; "))));
    }
}

// The workbook's limits (tailwise/limits.h) against the headline figures: each limit's amount,
// the figure, the share of the limit used and the state in words. Nothing when there are none.
void addLimits(Document &doc, const std::vector<Limit> &limits, const RiskReport &r)
{
    if (limits.empty())
        return;
    doc.add(TextStyle::Heading, tr("Limits"));
    const auto uses = evaluateLimits(limits, {r.figures.var, r.figures.es, r.portfolioValue});
    if (!uses) {
        doc.add(TextStyle::Body, tr("The limits could not be checked: %1.").arg(str(uses.error().message)));
        return;
    }
    Table t;
    t.columns = {{tr("Measure"), false, 1.0}, {tr("Limit"), true, 1.4}, {tr("Limit in money"), true, 1.3},
                 {tr("Warning at"), true, 1.0}, {tr("Figure"), true, 1.3}, {tr("Used"), true, 1.0},
                 {tr("State"), false, 1.1}};
    for (std::size_t i = 0; i < uses.value().size(); ++i) {
        const LimitUse &u = uses.value()[i];
        t.rows.push_back({limitMeasureName(u.limit.measure), limitSetText(u.limit), moneyText(u.limitMoney, 0),
                          percentText(u.limit.warningLevel, 0), moneyText(u.value, 0), percentText(u.use, 1),
                          limitStateWord(u.state)});
        if (u.state == LimitState::Breached)
            t.boldRows.push_back(static_cast<int>(i)); // bold as well as the word, never colour alone
    }
    doc.add(t);
    doc.add(TextStyle::Note, anyBreached(uses.value())
                                 ? tr("At least one limit is breached: the figure is above the limit set in the workbook.")
                                 : tr("A limit is in warning from its warning level (80% of the limit unless set) "
                                      "and breached above the limit itself."));
}

void addLossTail(Document &doc, const RiskReport &r, const ChartFigure &chart)
{
    doc.add(TextStyle::Heading, tr("The loss tail"));
    doc.add(TextStyle::Body,
            tr("How likely each profit or loss over %1 is under the model. VaR marks the loss exceeded in %2 of "
               "cases; Expected Shortfall is the average of the losses beyond it. Larger losses than VaR do "
               "happen: VaR is not the worst case.")
                .arg(tradingDaysText(r.assumptions.horizonDays),
                     percentText(1.0 - r.assumptions.confidence, 1)));
    addFigure(doc, chart);
}

void addContributions(Document &doc, const RiskReport &r, const ChartFigure &chart)
{
    doc.add(TextStyle::Heading, tr("What drives the risk"));
    const bool scenarios = r.model.contributions == RiskModel::Historical || r.model.contributions == RiskModel::MonteCarlo;
    doc.add(TextStyle::Body,
            (scenarios ? tr("Under the %1 model, each holding's contribution is its part of the portfolio's VaR (its "
                            "average loss in the scenarios whose loss is near VaR, by a kernel estimate) and of ES (its "
                            "average loss in the scenarios beyond VaR)")
                       : tr("Under the %1 model, each holding's contribution is its part of the portfolio's VaR and ES "
                            "(Euler allocation)"))
                    .arg(modelLabel(r.model.contributions))
                + tr(": the parts add up to the headline figures, and a negative part is a hedge that lowers them. "
                     "“Alone” is the VaR the holding would have by itself under the same model."));
    Table t;
    t.columns = {{tr("Holding"), false, 3.0},       {tr("Exposure"), true, 1.35},
                 {tr("Weight"), true, 0.9},          {tr("VaR alone"), true, 1.2},
                 {tr("Contribution to VaR"), true, 1.45}, {tr("Share of VaR"), true, 1.0},
                 {tr("Contribution to ES"), true, 1.45}};
    double exposure = 0, alone = 0, component = 0, componentEs = 0;
    for (const HoldingRisk &h : r.holdings) {
        t.rows.push_back({shortName(str(h.asset)), moneyText(h.exposure, 0), percentText(h.weight, 1),
                          moneyText(h.standaloneVar, 0), moneyText(h.componentVar, 0),
                          percentText(h.componentShare, 1), moneyText(h.componentEs, 0)});
        exposure += h.exposure;
        alone += h.standaloneVar;
        component += h.componentVar;
        componentEs += h.componentEs;
    }
    t.rows.push_back({tr("Total"), moneyText(r.portfolioValue, 0),
                      percentText(r.portfolioValue != 0.0 ? std::optional<double>(1.0) : std::nullopt, 1),
                      moneyText(r.undiversifiedVar, 0), moneyText(component, 0),
                      percentText(shareOf(component, component), 1), moneyText(componentEs, 0)});
    t.boldLastRows = 1;
    doc.add(t);
    if (r.diversificationBenefit >= 0.0)
        doc.add(TextStyle::Body,
                tr("Held alone, the holdings' VaRs add up to %1; held together, VaR is %2: diversification lowers it "
                   "by %3.")
                    .arg(moneyText(r.undiversifiedVar, 0), moneyText(r.figures.var, 0),
                         moneyText(r.diversificationBenefit, 0)));
    else
        doc.add(TextStyle::Body,
                tr("Held alone, the holdings' VaRs add up to %1; held together, VaR is %2, higher by %3: under the %4 "
                   "model VaR is not subadditive here, so holding them together shows no diversification benefit.")
                    .arg(moneyText(r.undiversifiedVar, 0), moneyText(r.figures.var, 0),
                         moneyText(-r.diversificationBenefit, 0), modelLabel(r.model.used)));
    addFigure(doc, chart);
}

void addHorizonAndConfidence(Document &doc, const RiskReport &r, const ChartFigure &chart)
{
    const Assumptions &a = r.assumptions;
    doc.add(TextStyle::Heading, tr("Horizon and confidence"));
    doc.add(TextStyle::Body, tr("How VaR grows with the horizon and with the confidence. Every cell of the table and "
                                "the chart is under the %1 model, as the headline figures, so the cell at the "
                                "current setting (in bold) is the headline VaR.")
                                 .arg(modelLabel(r.model.used)));
    auto horizons = reportHorizons(a);
    if (r.model.used == RiskModel::Historical && a.historicalHorizon == HistoricalHorizon::Overlapping)
        std::erase_if(horizons, [&](int h) { return h > r.windowReturns - 1; });
    const auto confidences = reportConfidences(a);
    auto modelGrid = modelRiskGrid(r, horizons, confidences);
    if (!modelGrid) {
        doc.add(TextStyle::Body, tr("No table: %1.").arg(str(modelGrid.error().message)));
        return;
    }
    const RiskGrid &grid = modelGrid.value();
    Table t;
    t.columns.push_back({tr("Horizon"), false, 2.0});
    for (double c : confidences)
        t.columns.push_back({tr("VaR at %1").arg(confidence(c)), true, 1.0});
    for (std::size_t h = 0; h < horizons.size(); ++h) {
        QString name = tradingDaysText(horizons[h]);
        if (horizons[h] == a.daysPerYear)
            name += tr(" (1 year)");
        else if (horizons[h] == 5)
            name += tr(" (1 week)");
        else if (horizons[h] == 21)
            name += tr(" (1 month)");
        else if (horizons[h] == 63)
            name += tr(" (1 quarter)");
        QStringList row{name};
        for (std::size_t c = 0; c < confidences.size(); ++c)
            row << moneyText(grid.varAt(h, c), 0);
        if (horizons[h] == a.horizonDays)
            t.boldRows.push_back(static_cast<int>(h));
        t.rows.push_back(row);
    }
    doc.add(t);
    if (const auto turn = normalVarTurningHorizon(r.oneDay, a.confidence);
        r.model.used == RiskModel::Normal && turn && std::isfinite(*turn) && *turn <= 10.0 * a.daysPerYear)
        doc.add(TextStyle::Note, tr("With the estimated expected gain, VaR at %1 stops growing after about %2 "
                                    "trading days and falls beyond: the gain then outweighs the spread.")
                                     .arg(confidence(a.confidence), number(*turn, 0)));
    addFigure(doc, chart);
}

void addBacktest(Document &doc, const BacktestPart &part, const ChartFigure &chart)
{
    using namespace backtestwords;
    doc.add(TextStyle::Heading, tr("Backtest"));
    if (!part.main) {
        doc.add(TextStyle::Body, tr("The backtest could not run: %1").arg(str(part.main.error().message)));
        return;
    }
    const BacktestResult &r = part.main.value();
    const BacktestVerdict v = verdictAt(r, part.testSize);
    const QLocale locale;
    doc.add(TextStyle::Body,
            tr("Would the %1 model's one-day VaR at %2 have held up? Each day from %3 to %4 its VaR was forecast "
               "from the %5 daily returns before it, with today's holdings kept fixed, and compared with the loss "
               "the holdings made that day.")
                .arg(modelLabel(r.assumptions.model), confidence(r.assumptions.confidence),
                     r.days.empty() ? kDash : dateText(r.days.front().date),
                     r.days.empty() ? kDash : dateText(r.days.back().date), locale.toString(r.window)));
    QStringList rejected;
    if (v.kupiecRejected)
        rejected << tr("Kupiec (%1)").arg(v.tooManyExceptions ? tr("too many exceptions") : tr("too few exceptions"));
    if (v.independenceRejected)
        rejected << tr("independence (%1)").arg(v.clustering ? tr("exceptions cluster") : tr("too evenly spread"));
    if (v.coverageRejected)
        rejected << tr("conditional coverage");
    doc.add(TextStyle::Subheading,
            v.passed ? tr("Tests: passed at the %1 test size — no test rejects the model.").arg(sizeText(part.testSize))
                     : tr("Tests: not passed at the %1 test size — rejected by %2.")
                           .arg(sizeText(part.testSize), rejected.join(QStringLiteral(", "))));
    doc.add(TextStyle::Body, tr("Traffic-light zone: %1 — %2 exceptions in %3 days where %4 were expected: %5.")
                                 .arg(zoneName(r.zone.zone).toLower(), locale.toString(r.exceptions),
                                      locale.toString(r.observations), number(r.expectedExceptions, 1),
                                      zoneMeaning(r.zone.zone)));
    Table t;
    t.columns = {{tr("Test"), false, 1.6}, {tr("Statistic"), true, 1.0}, {tr("p-value"), true, 1.0},
                 {tr("Verdict"), false, 4.4}};
    t.rows.push_back({tr("Exceptions"), locale.toString(r.exceptions), QString(),
                      tr("expected %1 (%2 of %3 days); %4 zone: %5")
                          .arg(number(r.expectedExceptions, 1), percentText(r.tailProbability, 1),
                               locale.toString(r.observations), zoneName(r.zone.zone), zoneMeaning(r.zone.zone))});
    t.rows.push_back({tr("Kupiec (number of exceptions)"), number(r.kupiec.lr, 2), pValueText(r.kupiec.pValue),
                      kupiecWords(r, v)});
    t.rows.push_back({tr("Christoffersen independence"), number(r.christoffersen.independence.lr, 2),
                      pValueText(r.christoffersen.independence.pValue), independenceWords(r, v)});
    t.rows.push_back({tr("Conditional coverage"), number(r.christoffersen.conditionalCoverage.lr, 2),
                      pValueText(r.christoffersen.conditionalCoverage.pValue), coverageWords(v)});
    doc.add(t);
    doc.add(TextStyle::Note, tr("A test rejects the model when its p-value is below the test size (%1). The zone "
                                "counts the exceptions alone; the tests weigh them, and their timing, against "
                                "chance.")
                                 .arg(sizeText(part.testSize)));
    if (!r.warnings.empty()) {
        QStringList notes;
        for (const auto &w : r.warnings)
            notes << str(w);
        doc.add(TextStyle::Note, tr("Notes from the backtest: %1.").arg(notes.join(QStringLiteral("; "))));
    }
    addFigure(doc, chart);

    if (part.others.empty())
        return;
    doc.add(TextStyle::Subheading, tr("Models side by side"));
    Table c;
    c.columns = {{tr("Model"), false, 1.5},      {tr("Exceptions"), true, 1.0}, {tr("Kupiec p"), true, 1.0},
                 {tr("Independence p"), true, 1.4}, {tr("Coverage p"), true, 1.1}, {tr("Zone"), false, 0.8},
                 {tr("Verdict"), false, 1.1}};
    auto addRow = [&](RiskModel model, const Result<BacktestResult> &result) {
        if (!result) {
            c.rows.push_back({modelLabel(model), QString(), QString(), QString(), QString(), QString(),
                              tr("could not run: %1").arg(str(result.error().message))});
            return;
        }
        const BacktestResult &m = result.value();
        const BacktestVerdict mv = verdictAt(m, part.testSize);
        c.rows.push_back({modelLabel(model), locale.toString(m.exceptions), pValueText(m.kupiec.pValue),
                          pValueText(m.christoffersen.independence.pValue),
                          pValueText(m.christoffersen.conditionalCoverage.pValue), zoneName(m.zone.zone),
                          mv.passed ? tr("passed") : tr("not passed")});
    };
    addRow(r.assumptions.model, part.main);
    for (const auto &[model, result] : part.others)
        addRow(model, result);
    doc.add(c);
}

void addModelComparison(Document &doc, const Result<std::vector<ModelRow>> &rows, const RiskReport &r,
                        const ChartFigure &chart)
{
    doc.add(TextStyle::Heading, tr("The models compared"));
    if (!rows) {
        doc.add(TextStyle::Body, tr("No comparison: %1").arg(str(rows.error().message)));
        return;
    }
    doc.add(TextStyle::Body, tr("The same holdings, window and assumptions under each model: they differ by the "
                                "model alone. Models disagree most far in the tail; a wide spread between them is "
                                "itself a measure of how uncertain the figures are."));
    Table t;
    t.columns = {{tr("Model"), false, 1.8}, {tr("VaR"), true, 1.3},      {tr("% of value"), true, 1.0},
                 {tr("ES"), true, 1.3},     {tr("% of value"), true, 1.0}, {tr("Notes"), false, 3.0}};
    for (const ModelRow &m : rows.value()) {
        const QString name = m.used != m.model ? tr("%1 (as %2)").arg(modelLabel(m.model), modelLabel(m.used))
                                               : modelLabel(m.model);
        QStringList notes;
        if (!m.error.empty())
            notes << str(m.error);
        if (m.varStandardError && std::isfinite(*m.varStandardError))
            notes << tr("VaR ± %1 (standard error)").arg(moneyText(*m.varStandardError, 0));
        for (const auto &w : m.warnings)
            notes << str(w);
        if (m.figures)
            t.rows.push_back({name, moneyText(m.figures->var, 0), percentText(shareOf(m.figures->var, r.portfolioValue)),
                              moneyText(m.figures->es, 0), percentText(shareOf(m.figures->es, r.portfolioValue)),
                              notes.join(QStringLiteral("; "))});
        else
            t.rows.push_back({name, kDash, kDash, kDash, kDash, notes.join(QStringLiteral("; "))});
        if (m.model == r.assumptions.model)
            t.boldRows.push_back(static_cast<int>(t.rows.size()) - 1);
    }
    doc.add(t);
    doc.add(TextStyle::Note, tr("The model of the headline figures is in bold."));
    addFigure(doc, chart);
}

void addAssumptions(Document &doc, const WorkbookContents &w, const RiskReport *r)
{
    const Assumptions &a = r ? r->assumptions : w.assumptions;
    const QLocale locale;
    doc.add(TextStyle::Heading, tr("Assumptions"));
    doc.add(TextStyle::Body, tr("Everything the figures rest on, as set in the workbook."));
    Table t;
    t.header = false;
    t.columns = {{tr("Assumption"), false, 1.3}, {tr("Setting"), false, 3.7}};
    const PriceHistory &p = w.prices;
    if (p.dayCount() > 0)
        t.rows.push_back({tr("Price history"),
                          tr("%1 assets, daily closes on %2 days from %3 to %4")
                              .arg(locale.toString(static_cast<int>(p.assets.size())), locale.toString(p.dayCount()),
                                   dateText(p.dates.front()), dateText(p.dates.back()))});
    else
        t.rows.push_back({tr("Price history"), tr("none")});
    t.rows.push_back({tr("Holdings"), tr("%n holdings, kept unchanged over the horizon", static_cast<int>(w.holdings.size()))});
    QString window = a.window ? tr("the %1 most recent daily returns").arg(locale.toString(*a.window))
                              : tr("all of the history");
    if (r)
        window += tr(" (%1 returns, from %2 to %3)")
                      .arg(locale.toString(r->windowReturns), dateText(r->windowFirst), dateText(r->windowLast));
    t.rows.push_back({tr("Window"), window});
    t.rows.push_back({tr("Returns"), returnTypeLabel(a.returns)});
    QString weighting = estimatorLabel(a.estimator);
    if (a.estimator == CovarianceEstimator::Ewma)
        weighting += tr(", decay λ %1 (about %2 days carry the weight)")
                         .arg(number(a.lambda, 3), number(ewmaEffectiveDays(a.lambda), 1));
    t.rows.push_back({tr("Weighting (estimator)"), weighting});
    t.rows.push_back({tr("Expected gain (mean)"), meanLabel(a.mean)});
    QString model = modelLabel(a.model);
    switch (a.model) {
    case RiskModel::StudentT:
        model += a.dof.kind == DegreesOfFreedom::Kind::Given ? tr(", ν = %1").arg(number(a.dof.value, 2))
                                                             : tr(", ν fitted to the window's P&L");
        break;
    case RiskModel::Historical: model += QStringLiteral(", ") + historicalHorizonLabel(a.historicalHorizon); break;
    case RiskModel::MonteCarlo:
        model += tr(", %1 draws, seed %2").arg(locale.toString(a.simulations), QString::number(a.seed));
        model += a.dof.kind == DegreesOfFreedom::Kind::Given ? tr(", Student-t draws with ν = %1").arg(number(a.dof.value, 2))
                                                             : tr(", normal draws");
        break;
    default: break;
    }
    t.rows.push_back({tr("Model"), model});
    if (modelHasScaling(a.model)) {
        QString scaling = scalingLabel(a.scaling);
        if (r && modelHasScaling(r->model.used))
            scaling += QStringLiteral(". ") + scalingSentence(*r);
        t.rows.push_back({tr("Longer horizons"), scaling});
    }
    t.rows.push_back({tr("Confidence"), confidence(a.confidence)});
    t.rows.push_back({tr("Horizon"), tradingDaysText(a.horizonDays)});
    t.rows.push_back({tr("Days a year"), locale.toString(a.daysPerYear)});
    if (w.backtest) {
        QStringList models;
        for (RiskModel m : w.backtest->models)
            models << modelLabel(m);
        t.rows.push_back({tr("Backtest"), tr("rolling window of %1 returns, test size %2, %3")
                                              .arg(locale.toString(w.backtest->window),
                                                   backtestwords::sizeText(w.backtest->testSize),
                                                   models.join(QStringLiteral(", ")))});
    }
    doc.add(t);
}

namespace {

void addCautionsAt(Document &doc, bool withBacktest, double confidence)
{
    doc.add(TextStyle::Heading, tr("Cautions"));
    for (const Caution &c : cautions(confidence)) {
        doc.add(TextStyle::Subheading, c.title);
        doc.add(TextStyle::Body, c.text);
    }
    if (withBacktest) {
        doc.add(TextStyle::Subheading, tr("The backtest."));
        doc.add(TextStyle::Body, backtestwords::caution());
    }
}

} // namespace

void addCautions(Document &doc, bool withBacktest)
{
    addCautionsAt(doc, withBacktest, 0.99);
}


Document buildReport(const ReportInputs &in)
{
    Q_ASSERT(in.contents);
    Document doc;
    doc.workbookName = in.contents->title.isEmpty() ? in.workbookName
                                                    : tr("%1 — %2").arg(in.contents->title, in.workbookName);
    doc.dateText = QLocale().toString(in.date, QStringLiteral("d MMMM yyyy"));
    doc.footerNote = tr("Estimates from past prices under a model, not advice. VaR is not the worst case: see the "
                        "cautions at the end.");
    addTitle(doc, in);
    addStamp(doc, *in.contents);
    const RiskReport *report = in.report ? &in.report.value() : nullptr;
    if (report) {
        addHeadline(doc, *report);
        addLimits(doc, in.contents->limits, *report);
        addLossTail(doc, *report, in.charts.lossTail);
        addContributions(doc, *report, in.charts.contributions);
        addHorizonAndConfidence(doc, *report, in.charts.tradeoff);
    } else {
        doc.add(TextStyle::Heading, tr("Headline figures"));
        doc.add(TextStyle::Body, tr("No figures for these inputs: %1.").arg(str(in.report.error().message)));
    }
    if (in.backtest)
        addBacktest(doc, *in.backtest, in.charts.backtest);
    if (report && in.models)
        addModelComparison(doc, *in.models, *report, in.charts.models);
    addAssumptions(doc, *in.contents, report);
    addCautionsAt(doc, in.backtest.has_value(), in.contents->assumptions.confidence);
    return doc;
}

} // namespace tailwise::ui::report
