// Benchmark of the stages a large book goes through, on invented data it builds itself (seeded):
//   load       reading a 2,500-day × 1,000-asset price CSV (and the peak memory it takes)
//   covariance the sample covariance of those returns (1,000 × 1,000 from 2,499 returns)
//   var        VaR with contributions for 1,000 holdings, normal model, from the files' data
//   simulate   Monte Carlo, 100,000 draws on 200 assets (the first 200 of the same data)
//   backtest   5,000 tested days × 100 assets, normal model, 250-day window
//   edit       a quantity edit → the new headline in the window, 1,000 holdings
// Prints the median of a few runs of each (ms); it never fails on timing, since timings depend on
// the machine. `--write DIR` also leaves the data files there (prices-2500x1000.csv,
// holdings-1000.csv, holdings-200.csv) for tests/perf/side_by_side.py, which times the same work
// in NumPy and pandas; `--json` prints the figures as one JSON object; `--repeat N` sets the runs.
// Nothing here is real data and nothing is checked.
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "mainwindow.h"
#include "models/holdingsmodel.h"
#include "panels/holdingseditor.h"

#include "tailwise/backtest.h"
#include "tailwise/estimate.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/returns.h"
#include "tailwise/risk.h"
#include "tailwise/simulate.h"

#include <QApplication>
#include <QLabel>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <random>
#include <string>
#include <thread>
#include <vector>

#include <unistd.h>

using namespace tailwise;

namespace {

constexpr int loadDays = 2500, loadAssets = 1000, simulatedAssets = 200, draws = 100000;
constexpr int backtestDays = 5000, backtestAssets = 100, backtestWindow = 250;

// A one-factor geometric random walk: every asset moves with a common market draw (60 % of its
// variance) and its own; daily volatility between 0.8 % and 2.4 %. Invented, seeded.
PriceHistory inventedHistory(int days, int assets, std::uint64_t seed)
{
    PriceHistory h;
    std::mt19937_64 rng(seed);
    std::normal_distribution<double> normal;
    h.prices.resize(days, assets);
    for (int a = 0; a < assets; ++a) {
        h.assets.push_back("ASSET_" + std::to_string(a));
        h.prices(0, a) = 20.0 + (a % 97);
    }
    for (int d = 0; d < days; ++d)
        h.dates.push_back(Date{dateFromCivil(2016, 1, 4).serial + d});
    for (int d = 1; d < days; ++d) {
        const double market = normal(rng);
        for (int a = 0; a < assets; ++a) {
            const double vol = 0.008 + 0.016 * (a % 11) / 10.0;
            h.prices(d, a) = h.prices(d - 1, a) * std::exp(vol * (0.7746 * market + 0.6325 * normal(rng)));
        }
    }
    return h;
}

Holdings firstHoldings(const PriceHistory &h, int count)
{
    Holdings out;
    for (int a = 0; a < count; ++a)
        out.push_back(Holding{h.assets[static_cast<std::size_t>(a)], 100.0 + 7.0 * (a % 13), std::nullopt, std::nullopt});
    return out;
}

double msSince(std::chrono::steady_clock::time_point start)
{
    return std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count();
}

double median(std::vector<double> v)
{
    std::sort(v.begin(), v.end());
    const std::size_t n = v.size();
    return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

// Median wall time of `repeat` runs of `work`, in ms.
double timeMedian(int repeat, const std::function<void()> &work)
{
    std::vector<double> ms;
    for (int k = 0; k < repeat; ++k) {
        const auto start = std::chrono::steady_clock::now();
        work();
        ms.push_back(msSince(start));
    }
    return median(ms);
}

// Resident and peak resident memory of this process (Linux /proc), MiB; 0 where unavailable.
double procStatusMiB(const char *field)
{
    std::ifstream in("/proc/self/status");
    std::string line;
    const std::string key = std::string(field) + ":";
    while (std::getline(in, line))
        if (line.rfind(key, 0) == 0)
            return std::atof(line.c_str() + key.size()) / 1024.0;
    return 0.0;
}

// Resets the peak resident figure to the current one (Linux: "5" into clear_refs), so the peak
// measured next is that of the stage alone.
void resetPeakMemory()
{
    std::ofstream("/proc/self/clear_refs") << "5";
}

void writeFile(const std::filesystem::path &path, const std::string &text)
{
    std::ofstream(path, std::ios::binary) << text;
}

struct Figures {
    double loadMs = 0, loadPeakMiB = 0, loadBaseMiB = 0, dataMiB = 0, fileMiB = 0;
    double covarianceMs = 0, varMs = 0, varRiskMs = 0, simulateMs = 0, backtestMs = 0, editMs = 0, screenMs = 0;
    double var = 0, simulatedVar = 0, simulatedSe = 0;
};

struct EditFigures {
    double editMs = 0.0;   // edit → new headline, everything
    double screenMs = 0.0; // of which: results arrive → headline, table and visible chart redrawn
};

EditFigures editToHeadline(const PriceHistory &history, int holdings, int repeat)
{
    ui::WorkbookContents c;
    c.title = QStringLiteral("Benchmark book");
    c.prices = history;
    c.holdings = firstHoldings(history, holdings);
    ui::MainWindow window;
    window.workbook().resetContents(c, QString());
    window.results().computeNow(tailwise::ui::Part::Headline);
    ui::HoldingsModel *model = window.holdingsEditor()->model();
    auto *headline = window.findChild<QLabel *>(QStringLiteral("varMoney"));
    double quantity = 1000.0;
    QString shown;
    auto edit = [&] {
        quantity += 1.0;
        model->setData(model->index(holdings / 2, ui::HoldingsModel::QuantityColumn), quantity);
        window.results().computeNow(tailwise::ui::Part::Headline); // what the zero-delay timer runs on the next turn
        shown = headline->text();
    };
    edit(); // the first edit after opening fills the estimate cache
    EditFigures out;
    out.editMs = timeMedian(std::max(repeat, 5), edit);
    if (shown.isEmpty())
        std::fprintf(stderr, "bench_stages: the headline stayed empty\n");
    out.screenMs = timeMedian(std::max(repeat, 5), [&] {
        emit window.results().headlineChanged(); // what a new headline result makes every view do
    });
    return out;
}

} // namespace

int main(int argc, char **argv)
{
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    int repeat = 3;
    bool json = false;
    std::filesystem::path dir;
    for (int i = 1; i < argc; ++i) {
        const std::string arg = argv[i];
        if (arg == "--json")
            json = true;
        else if (arg == "--repeat" && i + 1 < argc)
            repeat = std::max(1, std::atoi(argv[++i]));
        else if (arg == "--write" && i + 1 < argc)
            dir = argv[++i];
        else {
            std::fprintf(stderr, "usage: bench_stages [--repeat N] [--write DIR] [--json]\n");
            return 2;
        }
    }
    const bool keepFiles = !dir.empty();
    if (!keepFiles)
        dir = std::filesystem::temp_directory_path() / ("tailwise-bench-" + std::to_string(::getpid()));
    std::filesystem::create_directories(dir);
    const auto pricesPath = dir / "prices-2500x1000.csv";
    Figures f;
    {
        const PriceHistory history = inventedHistory(loadDays, loadAssets, 2500);
        const std::string text = writePriceCsv(history);
        f.fileMiB = static_cast<double>(text.size()) / (1024.0 * 1024.0);
        writeFile(pricesPath, text);
        writeFile(dir / "holdings-1000.csv", writeHoldingsCsv(firstHoldings(history, loadAssets)));
        writeFile(dir / "holdings-200.csv", writeHoldingsCsv(firstHoldings(history, simulatedAssets)));
    }
    f.dataMiB = static_cast<double>(loadDays) * loadAssets * sizeof(double) / (1024.0 * 1024.0);

    // Load: the peak is measured on the first run, before anything else holds the data.
    f.loadBaseMiB = procStatusMiB("VmRSS");
    resetPeakMemory();
    PriceHistory history;
    {
        auto read = readPriceCsv(pricesPath.string());
        if (!read) {
            std::fprintf(stderr, "bench_stages: %s\n", read.error().message.c_str());
            return 1;
        }
        f.loadPeakMiB = procStatusMiB("VmHWM");
    }
    f.loadMs = timeMedian(repeat, [&] { history = std::move(readPriceCsv(pricesPath.string())).value(); });

    const Eigen::MatrixXd returns = computeReturns(history.prices, ReturnType::Simple);
    double checksum = 0.0;
    f.covarianceMs = timeMedian(repeat, [&] { checksum += sampleCovariance(returns)(0, 0); });

    const Holdings book = firstHoldings(history, loadAssets);
    Assumptions normal;
    StageTimings stages;
    std::vector<double> riskMs;
    f.varMs = timeMedian(repeat, [&] {
        RunControl control;
        control.timings = &stages;
        const auto r = computeRisk(history, book, normal, control);
        f.var = r ? r.value().figures.var : 0.0;
        riskMs.push_back(stages.riskMs);
    });
    f.varRiskMs = median(riskMs);

    {
        const Eigen::MatrixXd held = returns.leftCols(simulatedAssets);
        const Moments m = estimateMoments(held, CovarianceEstimator::Sample, 0.94, MeanModel::Zero);
        Eigen::VectorXd e(simulatedAssets);
        for (int a = 0; a < simulatedAssets; ++a)
            e(a) = book[static_cast<std::size_t>(a)].quantity * history.prices(history.prices.rows() - 1, a);
        f.simulateMs = timeMedian(repeat, [&] {
            const auto r = simulateVarEs(e, m.covariance, m.mean, 1, 0.99, SimulationSettings{draws, 1, std::nullopt});
            if (r) {
                f.simulatedVar = r.value().figures.var;
                f.simulatedSe = r.value().varStandardError;
            }
        });
    }
    {
        BacktestRequest request;
        request.prices = inventedHistory(backtestDays + backtestWindow + 1, backtestAssets, 5000);
        request.holdings = firstHoldings(request.prices, backtestAssets);
        request.assumptions.window = backtestWindow;
        f.backtestMs = timeMedian(repeat, [&] { checksum += runBacktest(request) ? 1.0 : 0.0; });
    }
    const EditFigures edit = editToHeadline(history, loadAssets, repeat);
    f.editMs = edit.editMs;
    f.screenMs = edit.screenMs;
    if (!keepFiles)
        std::filesystem::remove_all(dir);

    const unsigned threads = std::max(1u, std::thread::hardware_concurrency());
    if (json) {
        std::printf("{\"load_ms\": %.2f, \"load_peak_mib\": %.1f, \"load_base_mib\": %.1f, \"data_mib\": %.1f, "
                    "\"file_mib\": %.1f, \"covariance_ms\": %.2f, \"var_ms\": %.2f, \"var_risk_ms\": %.2f, "
                    "\"simulate_ms\": %.2f, \"backtest_ms\": %.2f, \"edit_ms\": %.2f, \"screen_ms\": %.2f, \"var\": %.6f, "
                    "\"simulated_var\": %.6f, \"simulated_se\": %.6f, \"threads\": %u}\n",
                    f.loadMs, f.loadPeakMiB, f.loadBaseMiB, f.dataMiB, f.fileMiB, f.covarianceMs, f.varMs, f.varRiskMs,
                    f.simulateMs, f.backtestMs, f.editMs, f.screenMs, f.var, f.simulatedVar, f.simulatedSe, threads);
        return 0;
    }
    std::printf("Tailwise stages, median of %d runs, %u hardware threads (invented data; no pass/fail)\n", repeat, threads);
    std::printf("  load     %4d days x %4d assets CSV (%.1f MiB)  %9.1f ms   peak memory %.0f MiB over %.0f MiB "
                "before (the prices alone are %.0f MiB)\n",
                loadDays, loadAssets, f.fileMiB, f.loadMs, f.loadPeakMiB - f.loadBaseMiB, f.loadBaseMiB, f.dataMiB);
    std::printf("  covariance of %d returns x %d assets          %9.1f ms\n", loadDays - 1, loadAssets, f.covarianceMs);
    std::printf("  VaR with contributions, %d holdings, normal   %9.1f ms   (risk stage alone %.1f ms; VaR %.2f)\n",
                loadAssets, f.varMs, f.varRiskMs, f.var);
    std::printf("  Monte Carlo, %d draws on %d assets        %9.1f ms   (VaR %.2f, SE %.2f)\n", draws, simulatedAssets,
                f.simulateMs, f.simulatedVar, f.simulatedSe);
    std::printf("  backtest, %d days x %d assets, window %d     %9.1f ms\n", backtestDays, backtestAssets, backtestWindow,
                f.backtestMs);
    std::printf("  edit -> headline in the window, %d holdings    %9.1f ms   (results -> screen alone %.1f ms)\n",
                loadAssets, f.editMs, f.screenMs);
    (void)checksum;
    return 0;
}
