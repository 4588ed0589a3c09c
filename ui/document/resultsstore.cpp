#include "document/resultsstore.h"

#include "document/backtestrequest.h"
#include "document/gridaxes.h"
#include "document/workbook.h"

#include "tailwise/modelgrid.h"

#include <Eigen/Core>

#include <QCoreApplication>

#include <memory>

namespace tailwise::ui {

namespace {

constexpr std::initializer_list<Part> everyPart{Part::Headline, Part::Overlays, Part::Comparison, Part::Backtest,
                                                Part::Stress,   Part::WhatIf,   Part::Grid};

// Closed-form and historical models take well under a frame; simulation does not.
bool heavy(const Assumptions &assumptions) { return assumptions.model == RiskModel::MonteCarlo; }

JobRunner::Where where(bool inBackground)
{
    return inBackground ? JobRunner::Where::Background : JobRunner::Where::Inline;
}

// The portfolio value as computeRisk sums it (risk.cpp: the exposures' sum).
double portfolioValue(const PriceHistory &prices, const Holdings &holdings)
{
    Eigen::VectorXd exposures(static_cast<Eigen::Index>(holdings.size()));
    for (std::size_t i = 0; i < holdings.size(); ++i)
        exposures[static_cast<Eigen::Index>(i)] = holdingExposure(holdings[i], prices);
    return exposures.sum();
}

} // namespace

ResultsStore::ResultsStore(Workbook &workbook) : QObject(&workbook), m_workbook(workbook)
{
    qRegisterMetaType<Part>();
    for (const Part p : everyPart) {
        QTimer &timer = m_timers[index(p)];
        timer.setSingleShot(true);
        timer.setInterval(p == Part::Backtest ? 150 : 0);
        connect(&timer, &QTimer::timeout, this, [this, p] { start(p, false); });
    }
    m_watched[index(Part::Headline)] = true;

    connect(&m_workbook, &Workbook::pricesChanged, this, [this] { ++m_pricesRevision; });
    connect(&m_workbook, &Workbook::contentsReset, this, [this] {
        // Nothing of the previous workbook is shown again.
        ++m_pricesRevision;
        m_runner.stopAll();
        m_report.reset();
        m_headlineError.reset();
        m_overlays.clear();
        m_comparison.reset();
        m_backtest = BacktestRun{};
        m_backtestComplete = BacktestRun{};
        m_stress.reset();
        m_trades.clear();
        m_whatIf.reset();
        m_grid = GridRun{};
        m_gridAwaitsHeadline = false;
        for (const Part p : everyPart) {
            m_status[index(p)] = PartStatus{};
            emitChanged(p);
        }
    });
    connect(&m_workbook, &Workbook::inputsChanged, this, [this] { inputsChanged(everyPart); });
    connect(&m_workbook, &Workbook::scenariosChanged, this, [this] { inputsChanged({Part::Stress}); });
    connect(&m_workbook, &Workbook::backtestSettingsChanged, this, &ResultsStore::backtestSettingsChanged);
    // The grid rescales the headline: it starts when the headline of its inputs is in.
    connect(this, &ResultsStore::headlineChanged, this, &ResultsStore::headlineSettled);
    connect(this, &ResultsStore::statusChanged, this, [this](Part p) {
        if (p == Part::Headline)
            headlineSettled();
    });
}

ResultsStore::~ResultsStore()
{
    m_runner.stopAll();
}

bool ResultsStore::hasData() const
{
    return m_workbook.hasPrices() && !m_workbook.holdings().empty();
}

QString ResultsStore::noDataMessage(const char *withoutPrices, const char *withoutHoldings) const
{
    return QString::fromUtf8(m_workbook.hasPrices() ? withoutHoldings : withoutPrices);
}

void ResultsStore::inputsChanged(std::initializer_list<Part> parts)
{
    for (const Part p : parts)
        markOutOfDate(p);
}

void ResultsStore::backtestSettingsChanged()
{
    const BacktestSettings s = m_workbook.backtestSettings();
    if (s.window == m_backtest.settings.window && s.models == m_backtest.settings.models
        && m_backtest.generation != 0) {
        // Only the test size changed: the same results, read at the new size.
        m_backtest.settings = s;
        m_backtestComplete.settings = s;
        emit backtestChanged();
        return;
    }
    inputsChanged({Part::Backtest});
}

void ResultsStore::markOutOfDate(Part part)
{
    const std::size_t i = index(part);
    if (part == Part::Headline)
        m_watched[i] = true; // the headline is always computed (a stop lasts until an input changes)
    ++m_inputs[i];
    if (part == Part::Grid)
        m_gridAwaitsHeadline = false;
    const bool wasRunning = m_status[i].state == PartState::Running;
    m_runner.stop(static_cast<int>(part));
    if (part == Part::Backtest && wasRunning)
        m_backtest = m_backtestComplete; // never a mix of two generations
    setStatus(part, m_status[i].generation == 0 ? PartState::Pending : PartState::OutOfDate);
    if (part == Part::Headline && wasRunning && !m_watched[i])
        emit headlineRunning(false);
    if (part == Part::Backtest && wasRunning)
        emit backtestChanged();
    if (part == Part::Grid && wasRunning)
        emit gridChanged(); // the figures held are now marked out of date
    if (m_watched[i])
        m_timers[i].start();
}

void ResultsStore::setWatched(Part part, bool watched)
{
    m_watched[index(part)] = watched;
    if (watched)
        request(part);
}

void ResultsStore::request(Part part)
{
    const PartStatus &s = status(part);
    if (s.state == PartState::Running)
        return;
    if ((s.state == PartState::Ready || s.state == PartState::Failed) && s.generation == inputGeneration(part))
        return;
    if (m_timers[index(part)].isActive())
        return; // about to start
    start(part, false);
}

void ResultsStore::computeNow(Part part)
{
    start(part, true);
}

void ResultsStore::cancel(Part part)
{
    const std::size_t i = index(part);
    m_timers[i].stop();
    if (m_status[i].state != PartState::Running)
        return;
    m_runner.stop(static_cast<int>(part));
    if (part == Part::Grid)
        m_gridAwaitsHeadline = false;
    if (part == Part::Backtest) {
        m_backtest = m_backtestComplete; // the previous complete run, never a part of this one
        emit backtestChanged();
    }
    if (part == Part::Headline)
        m_watched[i] = false; // until an input changes: the user stopped it
    setStatus(part, PartState::OutOfDate);
    if (part == Part::Headline) {
        emit headlineRunning(false);
        emit headlineChanged(); // the figures held are now marked out of date
    }
    if (part == Part::Grid)
        emit gridChanged();
}

void ResultsStore::setStatus(Part part, PartState state, const QString &message)
{
    PartStatus &s = m_status[index(part)];
    s.state = state;
    s.message = message;
    if (state != PartState::Running)
        s.progress = state == PartState::Ready ? 1.0 : 0.0;
    else
        s.progress = 0.0;
    emit statusChanged(part);
}

void ResultsStore::emitChanged(Part part)
{
    switch (part) {
    case Part::Headline: emit headlineChanged(); break;
    case Part::Overlays: emit overlaysChanged(); break;
    case Part::Comparison: emit comparisonChanged(); break;
    case Part::Backtest: emit backtestChanged(); break;
    case Part::Stress: emit stressChanged(); break;
    case Part::WhatIf: emit whatIfChanged(); break;
    case Part::Grid: emit gridChanged(); break;
    }
}

void ResultsStore::start(Part part, bool inlineAlways)
{
    m_timers[index(part)].stop();
    switch (part) {
    case Part::Headline: startHeadline(inlineAlways); break;
    case Part::Overlays: startOverlays(inlineAlways); break;
    case Part::Comparison: startComparison(inlineAlways); break;
    case Part::Backtest: startBacktest(inlineAlways); break;
    case Part::Stress: startStress(inlineAlways); break;
    case Part::WhatIf: startWhatIf(inlineAlways); break;
    case Part::Grid: startGrid(inlineAlways); break;
    }
}

// A job's progress, kept in the part's status and passed on.
#define TAILWISE_PROGRESS(part)                                                                                        \
    [this](double fraction) {                                                                                          \
        m_status[index(part)].progress = fraction;                                                                     \
        emit progress(part, fraction);                                                                                 \
    }

void ResultsStore::startHeadline(bool inlineAlways)
{
    const Part part = Part::Headline;
    const quint64 generation = inputGeneration(part);
    const bool wasRunning = state(part) == PartState::Running;
    if (!hasData()) {
        m_runner.stop(static_cast<int>(part));
        m_report.reset();
        m_headlineError = fieldError(ErrorKind::InsufficientData, "holdings",
                                     m_workbook.hasPrices() ? "add a holding to see its risk"
                                                            : "import a price history to start");
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed, QString::fromStdString(m_headlineError->message));
        if (wasRunning)
            emit headlineRunning(false);
        emit headlineChanged();
        return;
    }
    const bool background = heavy(m_workbook.assumptions()) && !inlineAlways;
    auto done = [this, generation, background](Result<RiskReport> result) {
        if (generation != inputGeneration(Part::Headline))
            return; // computed from inputs that have changed since
        if (result.ok()) {
            m_report = std::move(result).value();
            m_headlineError.reset();
        } else {
            m_headlineError = result.error();
            m_report.reset();
        }
        m_status[index(Part::Headline)].generation = generation;
        setStatus(Part::Headline, m_report ? PartState::Ready : PartState::Failed,
                  m_headlineError ? QString::fromStdString(m_headlineError->message) : QString());
        emit headlineChanged();
        if (background)
            emit headlineRunning(false);
    };
    if (!background) {
        // Inline: the workbook cannot change meanwhile, so the job reads it in place.
        const bool stopBackground = wasRunning;
        m_runner.start<RiskReport>(
            static_cast<int>(part), JobRunner::Where::Inline,
            [this](const RunControl &control) {
                return computeRisk(m_workbook.prices(), m_workbook.holdings(), m_workbook.assumptions(), control,
                                   m_estimates, m_pricesRevision);
            },
            done);
        if (stopBackground)
            emit headlineRunning(false);
        return;
    }
    // Copies: the worker never touches the workbook.
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    setStatus(part, PartState::Running);
    emit headlineRunning(true);
    m_runner.start<RiskReport>(
        static_cast<int>(part), JobRunner::Where::Background,
        [prices, holdings, assumptions](const RunControl &control) {
            return computeRisk(*prices, *holdings, assumptions, control);
        },
        done, TAILWISE_PROGRESS(Part::Headline));
}

void ResultsStore::startOverlays(bool inlineAlways)
{
    const Part part = Part::Overlays;
    const quint64 generation = inputGeneration(part);
    if (!hasData()) {
        m_runner.stop(static_cast<int>(part));
        m_overlays.clear();
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed, noDataMessage("import a price history to start", "add a holding to see its risk"));
        emit overlaysChanged();
        return;
    }
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    setStatus(part, PartState::Running);
    m_runner.start<std::vector<RiskReport>>(
        static_cast<int>(part), where(!inlineAlways),
        [prices, holdings, assumptions](const RunControl &control) -> Result<std::vector<RiskReport>> {
            // The models with a closed density, at the same inputs. (The main curve is already
            // the normal one, whatever the model.)
            std::vector<RiskReport> reports;
            for (const RiskModel model : {RiskModel::StudentT, RiskModel::CornishFisher}) {
                if (model == assumptions.model)
                    continue;
                if (control.stop.stop_requested())
                    return fieldError(ErrorKind::Cancelled, "model", "stopped");
                Assumptions a = assumptions;
                a.model = model;
                if (auto other = computeRisk(*prices, *holdings, a, control); other && other.value().model.used == model)
                    reports.push_back(std::move(other).value());
            }
            return reports;
        },
        [this, generation](Result<std::vector<RiskReport>> result) {
            if (generation != inputGeneration(Part::Overlays))
                return;
            m_overlays = result ? std::move(result).value() : std::vector<RiskReport>{};
            m_status[index(Part::Overlays)].generation = generation;
            setStatus(Part::Overlays, result ? PartState::Ready : PartState::Failed,
                      result ? QString() : QString::fromStdString(result.error().message));
            emit overlaysChanged();
        },
        TAILWISE_PROGRESS(Part::Overlays));
}

void ResultsStore::startComparison(bool inlineAlways)
{
    const Part part = Part::Comparison;
    const quint64 generation = inputGeneration(part);
    if (!hasData()) {
        m_runner.stop(static_cast<int>(part));
        m_comparison = Result<std::vector<ModelRow>>(
            fieldError(ErrorKind::InsufficientData, "holdings",
                       m_workbook.hasPrices() ? "add a holding to compare the models" : "import a price history to start"));
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed, QString::fromStdString(m_comparison->error().message));
        emit comparisonChanged();
        return;
    }
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    const double value = portfolioValue(*prices, *holdings);
    setStatus(part, PartState::Running);
    m_runner.start<std::vector<ModelRow>>(
        static_cast<int>(part), where(!inlineAlways),
        [prices, holdings, assumptions](const RunControl &control) {
            return compareModels(*prices, *holdings, assumptions, control);
        },
        [this, generation, value](Result<std::vector<ModelRow>> rows) {
            if (generation != inputGeneration(Part::Comparison))
                return;
            const bool ok = rows.ok();
            const QString message = ok ? QString() : QString::fromStdString(rows.error().message);
            m_comparison = std::move(rows);
            m_comparisonValue = value;
            m_status[index(Part::Comparison)].generation = generation;
            setStatus(Part::Comparison, ok ? PartState::Ready : PartState::Failed, message);
            emit comparisonChanged();
        },
        TAILWISE_PROGRESS(Part::Comparison));
}

void ResultsStore::startBacktest(bool inlineAlways)
{
    const Part part = Part::Backtest;
    const quint64 generation = inputGeneration(part);
    m_runner.stop(static_cast<int>(part));
    BacktestRun run;
    run.generation = generation;
    run.settings = m_workbook.backtestSettings();
    for (const RiskModel m : run.settings.models)
        run.models.push_back(BacktestModelRun{m, std::nullopt});
    if (!hasData() || run.models.empty()) {
        run.problem = fieldError(ErrorKind::InsufficientData, "holdings",
                                 m_workbook.hasPrices() ? "add a holding to backtest it"
                                                        : "import a price history to backtest the holdings");
        m_backtest = run;
        m_backtestComplete = run;
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed, QString::fromStdString(run.problem->message));
        emit backtestChanged();
        return;
    }
    m_backtest = std::move(run);
    setStatus(part, PartState::Running);
    emit backtestChanged();
    runBacktestModel(0, generation, inlineAlways);
}

void ResultsStore::runBacktestModel(std::size_t i, quint64 generation, bool inlineAlways)
{
    const double n = static_cast<double>(m_backtest.models.size());
    const BacktestRequest request = backtestRequestFor(m_workbook.contents(), m_backtest.settings, m_backtest.models[i].model);
    m_runner.start<BacktestResult>(
        static_cast<int>(Part::Backtest), where(!inlineAlways),
        [request](const RunControl &control) { return runBacktest(request, control); },
        [this, i, generation, inlineAlways](Result<BacktestResult> result) {
            if (generation != inputGeneration(Part::Backtest) || i >= m_backtest.models.size())
                return; // computed from inputs or settings that have changed since: never shown
            m_backtest.models[i].result = std::move(result);
            if (i + 1 < m_backtest.models.size()) {
                emit backtestChanged();
                runBacktestModel(i + 1, generation, inlineAlways);
                return;
            }
            m_backtestComplete = m_backtest;
            m_status[index(Part::Backtest)].generation = generation;
            setStatus(Part::Backtest, PartState::Ready);
            emit backtestChanged();
        },
        [this, i, n](double fraction) {
            const double overall = (static_cast<double>(i) + fraction) / n;
            m_status[index(Part::Backtest)].progress = overall;
            emit progress(Part::Backtest, overall);
        });
}

void ResultsStore::startStress(bool inlineAlways)
{
    const Part part = Part::Stress;
    const quint64 generation = inputGeneration(part);
    if (!hasData()) {
        m_runner.stop(static_cast<int>(part));
        m_stress.reset();
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed, noDataMessage("import a price history to start", "add a holding to see its risk"));
        emit stressChanged();
        return;
    }
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    auto scenarios = std::make_shared<std::vector<StressScenario>>(m_workbook.scenarios());
    setStatus(part, PartState::Running);
    m_runner.start<std::vector<StressOutcome>>(
        static_cast<int>(part), where(!inlineAlways),
        [prices, holdings, assumptions, scenarios](const RunControl &) {
            return runStress(*prices, *holdings, assumptions, *scenarios, stressWorstDays);
        },
        [this, generation](Result<std::vector<StressOutcome>> result) {
            if (generation != inputGeneration(Part::Stress))
                return;
            const bool ok = result.ok();
            const QString message = ok ? QString() : QString::fromStdString(result.error().message);
            m_stress = std::move(result);
            m_status[index(Part::Stress)].generation = generation;
            setStatus(Part::Stress, ok ? PartState::Ready : PartState::Failed, message);
            emit stressChanged();
        });
}

void ResultsStore::setWhatIfTrades(std::vector<Trade> trades)
{
    m_trades = std::move(trades);
    markOutOfDate(Part::WhatIf);
    if (m_trades.empty())
        start(Part::WhatIf, true); // nothing proposed: cleared at once
}

void ResultsStore::startWhatIf(bool inlineAlways)
{
    const Part part = Part::WhatIf;
    const quint64 generation = inputGeneration(part);
    if (m_trades.empty() || !hasData()) {
        m_runner.stop(static_cast<int>(part));
        m_whatIf.reset(); // nothing proposed (or nothing to apply it to): nothing to show
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Ready);
        emit whatIfChanged();
        return;
    }
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    auto trades = std::make_shared<std::vector<Trade>>(m_trades);
    const bool background = heavy(assumptions) && !inlineAlways;
    if (background)
        setStatus(part, PartState::Running);
    m_runner.start<WhatIf>(
        static_cast<int>(part), where(background),
        [prices, holdings, assumptions, trades](const RunControl &control) {
            return tailwise::whatIf(*prices, *holdings, assumptions, *trades, control);
        },
        [this, generation](Result<WhatIf> result) {
            if (generation != inputGeneration(Part::WhatIf))
                return;
            const bool ok = result.ok();
            const QString message = ok ? QString() : QString::fromStdString(result.error().message);
            m_whatIf = std::move(result);
            m_status[index(Part::WhatIf)].generation = generation;
            setStatus(Part::WhatIf, ok ? PartState::Ready : PartState::Failed, message);
            emit whatIfChanged();
        },
        TAILWISE_PROGRESS(Part::WhatIf));
}

void ResultsStore::setGridConfidences(std::vector<double> confidences)
{
    if (confidences == m_gridConfidences)
        return;
    m_gridConfidences = std::move(confidences);
    markOutOfDate(Part::Grid);
}

void ResultsStore::headlineSettled()
{
    if (!m_gridAwaitsHeadline)
        return;
    const PartStatus &headline = status(Part::Headline);
    if (headline.state == PartState::Running)
        return;
    const bool current = (headline.state == PartState::Ready || headline.state == PartState::Failed)
                         && headline.generation == inputGeneration(Part::Headline);
    if (current) {
        m_gridAwaitsHeadline = false;
        start(Part::Grid, false);
        return;
    }
    if (headline.state == PartState::OutOfDate && !isWatched(Part::Headline)) {
        // The headline was stopped: so is the grid waiting for it (its figures stay, out of date).
        m_gridAwaitsHeadline = false;
        setStatus(Part::Grid, m_status[index(Part::Grid)].generation == 0 ? PartState::Pending : PartState::OutOfDate);
        emit gridChanged();
    }
}

void ResultsStore::startGrid(bool inlineAlways)
{
    const Part part = Part::Grid;
    const quint64 generation = inputGeneration(part);
    const PartStatus &headline = status(Part::Headline);
    const bool headlineCurrent = headline.generation == inputGeneration(Part::Headline)
                                 && (headline.state == PartState::Ready || headline.state == PartState::Failed);
    if (!headlineCurrent) {
        if (inlineAlways) {
            computeNow(Part::Headline);
        } else {
            // Waits for the headline of the same inputs (computed first: the grid rescales it).
            m_runner.stop(static_cast<int>(part));
            m_gridAwaitsHeadline = true;
            setStatus(part, PartState::Running);
            emit gridChanged();
            request(Part::Headline);
            return;
        }
    }
    m_gridAwaitsHeadline = false;
    if (!m_report || state(Part::Headline) != PartState::Ready) {
        m_runner.stop(static_cast<int>(part));
        m_grid = GridRun{generation, std::nullopt, std::nullopt};
        m_status[index(part)].generation = generation;
        setStatus(part, PartState::Failed,
                  m_headlineError ? QString::fromStdString(m_headlineError->message) : QString());
        emit gridChanged();
        return;
    }
    auto report = std::make_shared<RiskReport>(*m_report);
    auto confidences = std::make_shared<std::vector<double>>(m_gridConfidences);
    setStatus(part, PartState::Running);
    emit gridChanged();
    m_runner.start<RiskGrid>(
        static_cast<int>(part), where(!inlineAlways),
        [report, confidences](const RunControl &control) {
            return modelRiskGrid(*report, gridHorizons(*report), *confidences, control);
        },
        [this, generation, report](Result<RiskGrid> result) {
            if (generation != inputGeneration(Part::Grid))
                return; // computed from inputs that have changed since
            const bool ok = result.ok();
            const QString message = ok ? QString() : QString::fromStdString(result.error().message);
            m_grid = GridRun{generation, *report, std::move(result)};
            m_status[index(Part::Grid)].generation = generation;
            setStatus(Part::Grid, ok ? PartState::Ready : PartState::Failed, message);
            emit gridChanged();
        },
        TAILWISE_PROGRESS(Part::Grid));
}

#undef TAILWISE_PROGRESS

} // namespace tailwise::ui
