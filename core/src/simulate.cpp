#include "tailwise/simulate.h"

#include "tailwise/allocation.h"
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

// The factor F with Σ = F Fᵀ: Cholesky's L, or V D^{1/2} of the eigen-decomposition when Σ is
// only semi-definite. b = Fᵀe (computed as U e with U = Lᵀ, as before).
struct Factor {
    Eigen::MatrixXd f;
    Eigen::VectorXd b;
};

Factor factorOf(const Eigen::MatrixXd &cov, const Eigen::VectorXd &e, bool wantMatrix)
{
    Factor out;
    const Eigen::LLT<Eigen::MatrixXd> llt(cov);
    if (llt.info() == Eigen::Success) {
        out.b = llt.matrixU() * e; // U = Lᵀ
        if (wantMatrix)
            out.f = llt.matrixL();
        return out;
    }
    const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(cov);
    out.f = eig.eigenvectors() * eig.eigenvalues().cwiseMax(0.0).cwiseSqrt().asDiagonal();
    out.b = out.f.transpose() * e;
    return out;
}

// Runs `perBlock(block)` for every block on the threads; progress from `from` to `to`.
// Returns false when stopped.
template <class PerBlock>
bool runBlocks(int blocks, const RunControl &control, double from, double to, PerBlock perBlock)
{
    std::atomic<int> nextBlock{0};
    std::atomic<int> doneBlocks{0};
    std::atomic<bool> stopped{false};
    auto worker = [&](bool reportsProgress) {
        for (;;) {
            if (stopped || control.stop.stop_requested()) {
                stopped = true;
                return;
            }
            const int block = nextBlock.fetch_add(1);
            if (block >= blocks)
                return;
            if (!perBlock(block)) {
                stopped = true;
                return;
            }
            const int done = doneBlocks.fetch_add(1) + 1;
            if (reportsProgress && control.progress)
                control.progress(from + (to - from) * static_cast<double>(done) / blocks);
        }
    };
    int threads = control.threads > 0 ? control.threads : static_cast<int>(std::thread::hardware_concurrency());
    threads = std::clamp(threads, 1, std::max(blocks, 1));
    {
        std::vector<std::jthread> pool;
        for (int t = 1; t < threads; ++t)
            pool.emplace_back([&] { worker(false); });
        worker(true);
    } // jthreads join here
    return !stopped;
}

// One draw's standard vector z (into `z`) and its t mixing factor g (1 for normal draws).
double drawOne(BlockStream &stream, Eigen::VectorXd &z, bool useT, double nu, double tScale)
{
    for (Eigen::Index i = 0; i < z.size(); ++i)
        z(i) = stream.normal();
    return useT ? tScale / std::sqrt(stream.chiSquare(nu) / nu) : 1.0;
}

// The standard draws y_k = g_k bᵀz_k. Normals are drawn in the same order as drawOne.
bool standardDraws(const Eigen::VectorXd &b, int n, const SimulationSettings &settings, const RunControl &control,
                   double progressTo, std::vector<double> &ys)
{
    const int blocks = (n + simulationBlockSize - 1) / simulationBlockSize;
    const Eigen::Index dim = b.size();
    const bool useT = settings.dof.has_value();
    const double nu = settings.dof.value_or(0.0);
    const double tScale = useT ? studentTScale(nu) : 1.0;
    ys.assign(static_cast<std::size_t>(n), 0.0);
    return runBlocks(blocks, control, 0.0, progressTo, [&](int block) {
        BlockStream stream(blockSeed(settings.seed, static_cast<std::uint64_t>(block)));
        const int first = block * simulationBlockSize;
        const int last = std::min(n, first + simulationBlockSize);
        for (int k = first; k < last; ++k) {
            if (((k - first) & 1023) == 0 && control.stop.stop_requested())
                return false;
            double y = 0.0;
            for (Eigen::Index i = 0; i < dim; ++i)
                y += b(i) * stream.normal();
            if (useT)
                y *= tScale / std::sqrt(stream.chiSquare(nu) / nu);
            ys[static_cast<std::size_t>(k)] = y;
        }
        return true;
    });
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

namespace {

// The second pass of simulateVarEs with allocate (simulate.h): kernel and tail sums of g_k z_k,
// per block then added in block order (so the figures do not depend on the thread count).
Result<Allocation> allocateDraws(const Eigen::VectorXd &e, const Eigen::MatrixXd &cov, const Eigen::VectorXd &mean,
                                 int horizonDays, double confidence, const SimulationSettings &settings,
                                 const RunControl &control, const Factor &factor, const std::vector<double> &losses,
                                 VarEs figures)
{
    const int n = static_cast<int>(losses.size());
    const int blocks = (n + simulationBlockSize - 1) / simulationBlockSize;
    const Eigen::Index dim = factor.b.size();
    const bool useT = settings.dof.has_value();
    const double nu = settings.dof.value_or(0.0);
    const double tScale = useT ? studentTScale(nu) : 1.0;
    const double h = static_cast<double>(horizonDays);
    const double rootH = std::sqrt(h);
    const Eigen::VectorXd lossVector = Eigen::Map<const Eigen::VectorXd>(losses.data(), n);
    const double bandwidth = silvermanBandwidth(lossVector);
    const double var = figures.var;

    struct Sums {
        Eigen::VectorXd kernel, tail;
        double weight = 0.0, weightedLoss = 0.0;
        int tailCount = 0;
    };
    std::vector<Sums> perBlock(static_cast<std::size_t>(blocks));
    const bool ok = runBlocks(blocks, control, 0.5, 0.95, [&](int block) {
        Sums &acc = perBlock[static_cast<std::size_t>(block)];
        acc.kernel = Eigen::VectorXd::Zero(dim);
        acc.tail = Eigen::VectorXd::Zero(dim);
        BlockStream stream(blockSeed(settings.seed, static_cast<std::uint64_t>(block)));
        Eigen::VectorXd z(dim);
        const int first = block * simulationBlockSize;
        const int last = std::min(n, first + simulationBlockSize);
        for (int k = first; k < last; ++k) {
            if (((k - first) & 1023) == 0 && control.stop.stop_requested())
                return false;
            const double g = drawOne(stream, z, useT, nu, tScale);
            const double loss = losses[static_cast<std::size_t>(k)];
            if (bandwidth > 0.0) {
                const double u = (loss - var) / bandwidth;
                const double w = std::exp(-0.5 * u * u) / std::sqrt(2.0 * std::numbers::pi);
                acc.kernel += (w * g) * z;
                acc.weight += w;
                acc.weightedLoss += w * loss;
            }
            if (loss >= var) {
                acc.tail += g * z;
                ++acc.tailCount;
            }
        }
        return true;
    });
    if (!ok)
        return fieldError(ErrorKind::Cancelled, "simulations", "the simulation was cancelled");
    Sums total;
    total.kernel = Eigen::VectorXd::Zero(dim);
    total.tail = Eigen::VectorXd::Zero(dim);
    for (const Sums &s : perBlock) {
        total.kernel += s.kernel;
        total.tail += s.tail;
        total.weight += s.weight;
        total.weightedLoss += s.weightedLoss;
        total.tailCount += s.tailCount;
    }
    const Eigen::VectorXd drift = h * mean.cwiseProduct(e);
    Allocation a;
    a.total = figures;
    // Tail: −Σ_{tail} P_{k,i} / count = −(e_i H μ_i + √H e_i (F tail)_i / count).
    a.componentEs = -(drift + rootH * e.cwiseProduct(factor.f * total.tail) / static_cast<double>(total.tailCount));
    if (bandwidth > 0.0 && total.weightedLoss != 0.0 && std::isfinite(total.weightedLoss)) {
        const Eigen::VectorXd weightedPnl = drift * total.weight + rootH * e.cwiseProduct(factor.f * total.kernel);
        a.componentVar = var * (-weightedPnl) / total.weightedLoss;
    } else {
        a.componentVar = figures.es != 0.0 ? Eigen::VectorXd(a.componentEs * (var / figures.es)) : Eigen::VectorXd::Zero(e.size());
        a.warnings.push_back("the simulated losses have no spread around the VaR, so the kernel estimate of each "
                             "holding's part of VaR is not defined: VaR is split in proportion to the holdings' parts of ES");
    }
    // Standalone: a unit one-asset book, long and short, with the same seed.
    SimulationSettings unitSettings = settings;
    unitSettings.allocate = false;
    const Eigen::MatrixXd one = Eigen::MatrixXd::Ones(1, 1);
    const Eigen::VectorXd zero = Eigen::VectorXd::Zero(1);
    RunControl quiet;
    quiet.stop = control.stop;
    quiet.threads = control.threads;
    auto longUnit = simulateVarEs(Eigen::VectorXd::Ones(1), one, zero, horizonDays, confidence, unitSettings, quiet);
    if (!longUnit)
        return longUnit.error();
    auto shortUnit = simulateVarEs(-Eigen::VectorXd::Ones(1), one, zero, horizonDays, confidence, unitSettings, quiet);
    if (!shortUnit)
        return shortUnit.error();
    a.standaloneVar.resize(e.size());
    a.standaloneEs.resize(e.size());
    for (Eigen::Index i = 0; i < e.size(); ++i) {
        const VarEs unit = e(i) >= 0.0 ? longUnit.value().figures : shortUnit.value().figures;
        const double scale = std::abs(e(i)) * std::sqrt(std::max(0.0, cov(i, i)));
        a.standaloneVar(i) = scale * unit.var - drift(i);
        a.standaloneEs(i) = scale * unit.es - drift(i);
    }
    finishAllocation(a, e);
    return a;
}

} // namespace

Result<Eigen::VectorXd> simulateStandardPnl(const Eigen::VectorXd &e, const Eigen::MatrixXd &cov,
                                            const SimulationSettings &settings, const RunControl &control)
{
    if (settings.simulations < 1000)
        return fieldError(ErrorKind::Assumption, "simulations",
                          "expected at least 1000 draws, found " + std::to_string(settings.simulations));
    const Factor factor = factorOf(cov, e, false);
    std::vector<double> ys;
    if (!standardDraws(factor.b, settings.simulations, settings, control, 1.0, ys))
        return fieldError(ErrorKind::Cancelled, "simulations", "the simulation was cancelled");
    return Eigen::VectorXd(Eigen::Map<const Eigen::VectorXd>(ys.data(), static_cast<Eigen::Index>(ys.size())));
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
    const Factor factor = factorOf(cov, e, settings.allocate);

    std::vector<double> ys;
    if (!standardDraws(factor.b, n, settings, control, settings.allocate ? 0.5 : 0.95, ys))
        return fieldError(ErrorKind::Cancelled, "simulations", "the simulation was cancelled");
    std::vector<double> losses(static_cast<std::size_t>(n));
    for (std::size_t k = 0; k < losses.size(); ++k)
        losses[k] = -(drift + rootH * ys[k]);

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
    if (settings.allocate) {
        auto allocation = allocateDraws(e, cov, mean, horizonDays, confidence, settings, control, factor, losses,
                                        out.figures);
        if (!allocation)
            return allocation.error();
        out.allocation = std::move(allocation).value();
    }
    if ((1.0 - confidence) * static_cast<double>(per) < 10.0)
        out.warnings.push_back("each of the " + std::to_string(simulationBatches) + " batches of "
                               + std::to_string(per) + " draws has fewer than 10 losses beyond the VaR: the standard "
                                                       "error is rough; use more simulations");
    if (control.progress)
        control.progress(1.0);
    return out;
}

} // namespace tailwise
