#include "tailwise/simulate.h"

#include "tailwise/historical.h"
#include "tailwise/studentt.h"

#include <Eigen/Cholesky>
#include <Eigen/Eigenvalues>

#include <algorithm>
#include <atomic>
#include <bit>
#include <cassert>
#include <cmath>
#include <numbers>
#include <random>
#include <span>
#include <thread>
#include <vector>

namespace tailwise {

namespace {

std::uint64_t splitMix64(std::uint64_t x)
{
    x += 0x9e3779b97f4a7c15ULL;
    x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
    x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
    return x ^ (x >> 31);
}

// The ziggurat of Marsaglia & Tsang (2000), "The Ziggurat Method for Generating Random Variables",
// J. Statistical Software 5(8) (mem): the area under f(x) = exp(−x²/2), x ≥ 0, is cut into 256
// layers of equal area v — a base strip of width v/f(r) holding the tail beyond r, and 255
// rectangles of widths x₁ = r > x₂ > … > x₂₅₅ — so that most draws need one random word, a table
// look-up and a comparison. r is found here by bisection so that the layers close exactly at the
// top (f(x₂₅₅) + v/x₂₅₅ = 1); it comes out at 3.6541528853610088, the published value for 256
// layers. The table is built once, from <cmath> alone, so every platform draws the same numbers.
struct Ziggurat {
    static constexpr int layers = 256;
    double r = 0.0;
    double x[layers + 1]; // x[0] = v/f(r) (base strip), x[1] = r, …, x[256] = 0
    double fx[layers + 1];

    static double f(double v) { return std::exp(-0.5 * v * v); }

    // f(x_{N−1}) + v/x_{N−1} − 1 for a trial r: positive when r is too small.
    static double closure(double trial, double *widths)
    {
        const double v = trial * f(trial) + std::sqrt(0.5 * std::numbers::pi) * std::erfc(trial / std::sqrt(2.0));
        double w = trial;
        if (widths) {
            widths[0] = v / f(trial);
            widths[1] = trial;
        }
        for (int i = 1; i < layers - 1; ++i) {
            const double y = f(w) + v / w;
            if (y >= 1.0)
                return 1.0 + (layers - 1 - i); // closed too early: r is too small
            w = std::sqrt(-2.0 * std::log(y));
            if (widths)
                widths[i + 1] = w;
        }
        return f(w) + v / w - 1.0;
    }

    Ziggurat()
    {
        double lo = 2.0, hi = 5.0;
        for (int k = 0; k < 200; ++k) {
            const double mid = 0.5 * (lo + hi);
            (closure(mid, nullptr) > 0.0 ? lo : hi) = mid;
        }
        r = lo;
        closure(r, x);
        x[layers] = 0.0;
        for (int i = 0; i <= layers; ++i)
            fx[i] = f(x[i]);
        fx[0] = f(r); // the base strip's top is f(r) (only the wedge test of layers ≥ 1 reads fx)
    }
};

const Ziggurat &ziggurat()
{
    static const Ziggurat table;
    return table;
}

// One block's stream of variates; everything it draws follows from its seed alone.
class BlockStream {
public:
    explicit BlockStream(std::uint64_t seed) : m_engine(seed), m_zig(ziggurat()) {}

    // Uniform on (0, 1): 53 random bits, never exactly 0.
    double uniform()
    {
        for (;;) {
            const double u = static_cast<double>(m_engine() >> 11) * 0x1.0p-53;
            if (u > 0.0)
                return u;
        }
    }

    // Standard normal by the ziggurat above. One 64-bit word gives the layer (low 8 bits), the
    // sign (bit 8) and a 53-bit uniform (the top bits); the rare wedge and tail cases draw more.
    // The sign is set by moving bit 8 into the sign bit: a branch on it would be mispredicted
    // half the time, which costs more than all the rest of a draw.
    double normal()
    {
        for (;;) {
            const std::uint64_t word = m_engine();
            const int layer = static_cast<int>(word & 0xFF);
            const std::uint64_t sign = (word & 0x100) << 55;
            const double u = static_cast<double>(word >> 11) * 0x1.0p-53;
            const double x = u * m_zig.x[layer];
            if (x < m_zig.x[layer + 1]) [[likely]]
                return std::bit_cast<double>(std::bit_cast<std::uint64_t>(x) | sign);
            const bool negative = sign != 0;
            if (layer == 0) {
                // The tail beyond r (Marsaglia 1964, as in the ziggurat paper): r + a with
                // a = −ln(U₁)/r accepted when −2 ln(U₂) > a².
                double a = 0.0, b = 0.0;
                do {
                    a = -std::log(uniform()) / m_zig.r;
                    b = -std::log(uniform());
                } while (b + b < a * a);
                return negative ? -(m_zig.r + a) : m_zig.r + a;
            }
            // The wedge between layer's rectangle and the curve.
            const double y = m_zig.fx[layer] + uniform() * (m_zig.fx[layer + 1] - m_zig.fx[layer]);
            if (y < Ziggurat::f(x))
                return negative ? -x : x;
        }
    }

    // Gamma(shape, 1) for shape ≥ 1, Marsaglia & Tsang (2000).
    double gamma(double shape)
    {
        assert(shape >= 1.0);
        const double d = shape - 1.0 / 3.0;
        const double c = 1.0 / std::sqrt(9.0 * d);
        for (;;) {
            const double x = normal();
            double v = 1.0 + c * x;
            if (v <= 0.0)
                continue;
            v = v * v * v;
            const double u = uniform();
            if (std::log(u) < 0.5 * x * x + d - d * v + d * std::log(v))
                return d * v;
        }
    }

    double chiSquare(double dof) { return 2.0 * gamma(0.5 * dof); }

private:
    std::mt19937_64 m_engine;
    const Ziggurat &m_zig;
};

// Lᵀe for Σ = L Lᵀ; the eigen factor V D^{1/2} when Σ is only semi-definite.
Eigen::VectorXd factorTimesExposures(const Eigen::MatrixXd &cov, const Eigen::VectorXd &e)
{
    const Eigen::LLT<Eigen::MatrixXd> llt(cov);
    if (llt.info() == Eigen::Success)
        return llt.matrixU() * e; // U = Lᵀ
    const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(cov);
    const Eigen::MatrixXd factor = eig.eigenvectors() * eig.eigenvalues().cwiseMax(0.0).cwiseSqrt().asDiagonal();
    return factor.transpose() * e;
}

// VaR and ES of losses by the type 7 quantile, with nth_element instead of a full sort.
VarEs fastVarEs(std::vector<double> losses, double confidence)
{
    const std::size_t n = losses.size();
    const double h = static_cast<double>(n - 1) * confidence;
    const auto j = static_cast<std::size_t>(std::floor(h));
    std::nth_element(losses.begin(), losses.begin() + static_cast<std::ptrdiff_t>(j), losses.end());
    const double lower = losses[j];
    double var = lower;
    if (j + 1 < n) {
        const double upper = *std::min_element(losses.begin() + static_cast<std::ptrdiff_t>(j) + 1, losses.end());
        var = lower + (h - std::floor(h)) * (upper - lower);
    }
    // Every value at or beyond VaR sits in [j, n) after nth_element, except ties below j.
    double sum = 0.0;
    long count = 0;
    for (double v : losses)
        if (v >= var) {
            sum += v;
            ++count;
        }
    return VarEs{var, sum / static_cast<double>(count)};
}

double batchSd(const std::vector<double> &values)
{
    double mean = 0.0;
    for (double v : values)
        mean += v;
    mean /= static_cast<double>(values.size());
    double ss = 0.0;
    for (double v : values)
        ss += (v - mean) * (v - mean);
    return std::sqrt(ss / static_cast<double>(values.size() - 1));
}

} // namespace

std::uint64_t blockSeed(std::uint64_t seed, std::uint64_t block)
{
    return splitMix64(splitMix64(seed) ^ block);
}

Result<SimulationFigures> simulateVarEs(const Eigen::VectorXd &e, const Eigen::MatrixXd &cov, const Eigen::VectorXd &mean,
                                        int horizonDays, double confidence, const SimulationSettings &settings,
                                        const RunControl &control)
{
    assert(cov.rows() == e.size() && cov.cols() == e.size() && mean.size() == e.size());
    assert(confidence > 0.0 && confidence < 1.0 && horizonDays >= 1);
    if (settings.simulations < 1000)
        return fieldError(ErrorKind::Assumption, "simulations",
                          "expected at least 1000 draws, found " + std::to_string(settings.simulations));
    const int n = settings.simulations;
    const int blocks = (n + simulationBlockSize - 1) / simulationBlockSize;
    const double h = static_cast<double>(horizonDays);
    const double rootH = std::sqrt(h);
    const double drift = h * e.dot(mean);
    const Eigen::VectorXd b = factorTimesExposures(cov, e);
    const Eigen::Index dim = b.size();
    const bool useT = settings.dof.has_value();
    const double nu = settings.dof.value_or(0.0);
    const double tScale = useT ? studentTScale(nu) : 1.0;

    std::vector<double> losses(static_cast<std::size_t>(n));
    std::atomic<int> nextBlock{0};
    std::atomic<int> doneBlocks{0};
    std::atomic<bool> stopped{false};

    auto runBlock = [&](int block) {
        BlockStream stream(blockSeed(settings.seed, static_cast<std::uint64_t>(block)));
        const int first = block * simulationBlockSize;
        const int last = std::min(n, first + simulationBlockSize);
        for (int k = first; k < last; ++k) {
            if (((k - first) & 1023) == 0 && control.stop.stop_requested()) {
                stopped = true;
                return;
            }
            double y = 0.0;
            for (Eigen::Index i = 0; i < dim; ++i)
                y += b(i) * stream.normal();
            if (useT)
                y *= tScale / std::sqrt(stream.chiSquare(nu) / nu);
            losses[static_cast<std::size_t>(k)] = -(drift + rootH * y);
        }
    };
    auto worker = [&](bool reportsProgress) {
        for (;;) {
            if (stopped || control.stop.stop_requested()) {
                stopped = true;
                return;
            }
            const int block = nextBlock.fetch_add(1);
            if (block >= blocks)
                return;
            runBlock(block);
            const int done = doneBlocks.fetch_add(1) + 1;
            if (reportsProgress && control.progress)
                control.progress(0.95 * static_cast<double>(done) / blocks);
        }
    };

    int threads = control.threads > 0 ? control.threads : static_cast<int>(std::thread::hardware_concurrency());
    threads = std::clamp(threads, 1, blocks);
    {
        std::vector<std::jthread> pool;
        for (int t = 1; t < threads; ++t)
            pool.emplace_back([&] { worker(false); });
        worker(true);
    } // jthreads join here
    if (stopped)
        return fieldError(ErrorKind::Cancelled, "simulations", "the simulation was cancelled");

    SimulationFigures out;
    out.simulations = n;
    out.blocks = blocks;
    out.figures = fastVarEs(losses, confidence);
    std::vector<double> batchVar, batchEs;
    const std::size_t per = losses.size() / simulationBatches;
    for (int k = 0; k < simulationBatches; ++k) {
        const auto begin = losses.begin() + static_cast<std::ptrdiff_t>(per * static_cast<std::size_t>(k));
        const VarEs f = fastVarEs(std::vector<double>(begin, begin + static_cast<std::ptrdiff_t>(per)), confidence);
        batchVar.push_back(f.var);
        batchEs.push_back(f.es);
    }
    const double root = std::sqrt(static_cast<double>(simulationBatches));
    out.varStandardError = batchSd(batchVar) / root;
    out.esStandardError = batchSd(batchEs) / root;
    out.standardErrorMethod = "batch means: the sd of the VaR of " + std::to_string(simulationBatches)
                              + " equal batches of consecutive draws, divided by the square root of "
                              + std::to_string(simulationBatches);
    if ((1.0 - confidence) * static_cast<double>(per) < 10.0)
        out.warnings.push_back("each of the " + std::to_string(simulationBatches) + " batches of "
                               + std::to_string(per) + " draws has fewer than 10 losses beyond the VaR: the standard "
                                                       "error is rough; use more simulations");
    if (control.progress)
        control.progress(1.0);
    return out;
}

} // namespace tailwise
