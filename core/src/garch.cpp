#include "tailwise/garch.h"

#include <Eigen/Cholesky>

#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>

namespace tailwise {

namespace {

double meanSquare(std::span<const double> r)
{
    double s = 0.0;
    for (double v : r)
        s += v * v;
    return s / static_cast<double>(r.size());
}

double logistic(double x) { return 1.0 / (1.0 + std::exp(-x)); }
double logit(double p) { return std::log(p / (1.0 - p)); }

using Point = std::array<double, 3>;

GarchParameters fromCoordinates(const Point &x, double m)
{
    const double phi = logistic(x[1]);
    const double s = logistic(x[2]);
    return GarchParameters{m * std::exp(x[0]), phi * s, phi * (1.0 - s)};
}

Point toCoordinates(const GarchParameters &p, double m)
{
    const double phi = p.alpha + p.beta;
    return Point{std::log(p.omega / m), logit(phi), logit(p.alpha / phi)};
}

// Nelder–Mead minimisation of f from x0 with initial steps `step` (standard coefficients 1, 2,
// ½, ½). Stops when the spread of the simplex's values falls below `tolerance` (absolute) or after
// `maxEvaluations`. Returns whether it converged; x0 becomes the best point, fx its value.
template <class F>
bool nelderMead(F &&f, Point &x0, double &fx, double step, double tolerance, int maxEvaluations, int &evaluations)
{
    constexpr int n = 3;
    std::array<Point, n + 1> p;
    std::array<double, n + 1> v;
    p[0] = x0;
    v[0] = f(p[0]);
    ++evaluations;
    for (int i = 0; i < n; ++i) {
        p[i + 1] = x0;
        p[i + 1][static_cast<std::size_t>(i)] += step;
        v[i + 1] = f(p[i + 1]);
        ++evaluations;
    }
    int used = n + 1;
    bool converged = false;
    while (used < maxEvaluations) {
        // Order: best first.
        std::array<int, n + 1> order{0, 1, 2, 3};
        std::sort(order.begin(), order.end(), [&](int a, int b) { return v[static_cast<std::size_t>(a)] < v[static_cast<std::size_t>(b)]; });
        std::array<Point, n + 1> ps;
        std::array<double, n + 1> vs;
        for (int i = 0; i <= n; ++i) {
            ps[static_cast<std::size_t>(i)] = p[static_cast<std::size_t>(order[static_cast<std::size_t>(i)])];
            vs[static_cast<std::size_t>(i)] = v[static_cast<std::size_t>(order[static_cast<std::size_t>(i)])];
        }
        p = ps;
        v = vs;
        double size = 0.0;
        for (int i = 1; i <= n; ++i)
            for (int k = 0; k < n; ++k)
                size = std::max(size, std::abs(p[static_cast<std::size_t>(i)][static_cast<std::size_t>(k)] - p[0][static_cast<std::size_t>(k)]));
        if (v[n] - v[0] <= tolerance && size < 1e-7) {
            converged = true;
            break;
        }
        Point centroid{0, 0, 0};
        for (int i = 0; i < n; ++i)
            for (int k = 0; k < n; ++k)
                centroid[static_cast<std::size_t>(k)] += p[static_cast<std::size_t>(i)][static_cast<std::size_t>(k)] / n;
        auto along = [&](double t) {
            Point q;
            for (int k = 0; k < n; ++k)
                q[static_cast<std::size_t>(k)] = centroid[static_cast<std::size_t>(k)]
                                                 + t * (p[n][static_cast<std::size_t>(k)] - centroid[static_cast<std::size_t>(k)]);
            return q;
        };
        const Point xr = along(-1.0);
        const double fr = f(xr);
        ++used;
        if (fr < v[0]) {
            const Point xe = along(-2.0);
            const double fe = f(xe);
            ++used;
            if (fe < fr) {
                p[n] = xe;
                v[n] = fe;
            } else {
                p[n] = xr;
                v[n] = fr;
            }
        } else if (fr < v[n - 1]) {
            p[n] = xr;
            v[n] = fr;
        } else {
            const bool outside = fr < v[n];
            const Point xc = along(outside ? -0.5 : 0.5);
            const double fc = f(xc);
            ++used;
            if (fc < (outside ? fr : v[n])) {
                p[n] = xc;
                v[n] = fc;
            } else {
                for (int i = 1; i <= n; ++i) {
                    for (int k = 0; k < n; ++k)
                        p[static_cast<std::size_t>(i)][static_cast<std::size_t>(k)] =
                            p[0][static_cast<std::size_t>(k)]
                            + 0.5 * (p[static_cast<std::size_t>(i)][static_cast<std::size_t>(k)] - p[0][static_cast<std::size_t>(k)]);
                    v[static_cast<std::size_t>(i)] = f(p[static_cast<std::size_t>(i)]);
                    ++used;
                }
            }
        }
    }
    int best = 0;
    for (int i = 1; i <= n; ++i)
        if (v[static_cast<std::size_t>(i)] < v[static_cast<std::size_t>(best)])
            best = i;
    x0 = p[static_cast<std::size_t>(best)];
    fx = v[static_cast<std::size_t>(best)];
    evaluations += used - (n + 1);
    return converged;
}

std::optional<GarchParameters> standardErrorsAt(std::span<const double> r, const GarchParameters &p)
{
    const std::array<double, 3> theta{p.omega, p.alpha, p.beta};
    std::array<double, 3> h{};
    for (std::size_t i = 0; i < 3; ++i)
        h[i] = 1e-4 * std::max(std::abs(theta[i]), i == 0 ? 1e-3 * p.omega + 1e-300 : 1e-3);
    // Steps must stay inside the domain (ω > 0, α, β ≥ 0).
    for (std::size_t i = 0; i < 3; ++i)
        if (theta[i] - 2.0 * h[i] <= (i == 0 ? 0.0 : -1e-300))
            return std::nullopt;
    auto at = [&](std::array<double, 3> t) { return garchLogLikelihood(r, GarchParameters{t[0], t[1], t[2]}); };
    Eigen::Matrix3d hess;
    const double f0 = at(theta);
    for (std::size_t i = 0; i < 3; ++i) {
        for (std::size_t j = i; j < 3; ++j) {
            double value;
            if (i == j) {
                auto up = theta, down = theta;
                up[i] += h[i];
                down[i] -= h[i];
                value = (at(up) - 2.0 * f0 + at(down)) / (h[i] * h[i]);
            } else {
                auto pp = theta, pm = theta, mp = theta, mm = theta;
                pp[i] += h[i]; pp[j] += h[j];
                pm[i] += h[i]; pm[j] -= h[j];
                mp[i] -= h[i]; mp[j] += h[j];
                mm[i] -= h[i]; mm[j] -= h[j];
                value = (at(pp) - at(pm) - at(mp) + at(mm)) / (4.0 * h[i] * h[j]);
            }
            hess(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) = value;
            hess(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(i)) = value;
        }
    }
    const Eigen::Matrix3d information = -hess;
    Eigen::LLT<Eigen::Matrix3d> llt(information);
    if (llt.info() != Eigen::Success)
        return std::nullopt;
    const Eigen::Matrix3d cov = llt.solve(Eigen::Matrix3d::Identity());
    if (!(cov(0, 0) > 0.0 && cov(1, 1) > 0.0 && cov(2, 2) > 0.0) || !cov.allFinite())
        return std::nullopt;
    return GarchParameters{std::sqrt(cov(0, 0)), std::sqrt(cov(1, 1)), std::sqrt(cov(2, 2))};
}

} // namespace

double garchLogLikelihood(std::span<const double> r, const GarchParameters &p, Eigen::VectorXd *variances)
{
    assert(!r.empty());
    const std::size_t n = r.size();
    if (variances)
        variances->resize(static_cast<Eigen::Index>(n));
    double s2 = meanSquare(r);
    double sum = 0.0;
    for (std::size_t t = 0; t < n; ++t) {
        if (t > 0)
            s2 = p.omega + p.alpha * r[t - 1] * r[t - 1] + p.beta * s2;
        if (variances)
            (*variances)(static_cast<Eigen::Index>(t)) = s2;
        sum += std::log(s2) + r[t] * r[t] / s2;
    }
    return -0.5 * (static_cast<double>(n) * std::log(2.0 * std::numbers::pi) + sum);
}

double garchNextVariance(std::span<const double> r, const GarchParameters &p, Eigen::VectorXd *variances)
{
    assert(!r.empty());
    double s2 = meanSquare(r);
    if (variances)
        variances->resize(static_cast<Eigen::Index>(r.size()));
    for (std::size_t t = 0; t < r.size(); ++t) {
        if (t > 0)
            s2 = p.omega + p.alpha * r[t - 1] * r[t - 1] + p.beta * s2;
        if (variances)
            (*variances)(static_cast<Eigen::Index>(t)) = s2;
    }
    return p.omega + p.alpha * r.back() * r.back() + p.beta * s2;
}

double ewmaVariances(std::span<const double> r, double lambda, Eigen::VectorXd *variances)
{
    assert(!r.empty());
    double s2 = meanSquare(r);
    if (variances)
        variances->resize(static_cast<Eigen::Index>(r.size()));
    for (std::size_t t = 0; t < r.size(); ++t) {
        if (t > 0)
            s2 = lambda * s2 + (1.0 - lambda) * r[t - 1] * r[t - 1];
        if (variances)
            (*variances)(static_cast<Eigen::Index>(t)) = s2;
    }
    return lambda * s2 + (1.0 - lambda) * r.back() * r.back();
}

GarchFit fitGarch(std::span<const double> r)
{
    GarchFit fit;
    const double m = r.empty() ? 0.0 : meanSquare(r);
    if (!(m > 0.0) || !std::isfinite(m)) {
        fit.outcome = FitOutcome::NoVariation;
        return fit;
    }
    int evaluations = 0;
    auto objective = [&](const Point &x) {
        const double value = -garchLogLikelihood(r, fromCoordinates(x, m));
        return std::isfinite(value) ? value : std::numeric_limits<double>::max();
    };
    // Tolerance on −ℓ: far below the 1e-6 the fit is judged by, relative to ℓ's size.
    const double tolerance = 1e-11 * std::max(1.0, std::abs(garchLogLikelihood(r, GarchParameters{m * 0.05, 0.05, 0.9})));
    static constexpr std::array<std::array<double, 2>, 6> starts{
        {{0.05, 0.90}, {0.10, 0.85}, {0.15, 0.80}, {0.05, 0.94}, {0.30, 0.60}, {0.10, 0.50}}};
    Point best{};
    double bestValue = std::numeric_limits<double>::max();
    bool converged = false;
    for (const auto &start : starts) {
        Point x = toCoordinates(GarchParameters{m * (1.0 - start[0] - start[1]), start[0], start[1]}, m);
        double fx = 0.0;
        bool ok = nelderMead(objective, x, fx, 0.5, tolerance, 600, evaluations);
        if (fx < bestValue) {
            bestValue = fx;
            best = x;
            converged = ok;
        }
    }
    // Restart at the best point with shrinking steps until a restart no longer improves.
    for (double step : {0.3, 0.1, 0.03, 0.01, 0.003}) {
        Point x = best;
        double fx = 0.0;
        const bool ok = nelderMead(objective, x, fx, step, tolerance, 3000, evaluations);
        if (fx <= bestValue) {
            const double gain = bestValue - fx;
            bestValue = fx;
            best = x;
            converged = ok;
            if (gain <= tolerance && step < 0.05)
                break;
        }
    }
    fit.parameters = fromCoordinates(best, m);
    fit.persistence = fit.parameters.alpha + fit.parameters.beta;
    fit.logLikelihood = garchLogLikelihood(r, fit.parameters, &fit.variances);
    fit.nextVariance = fit.parameters.omega + fit.parameters.alpha * r.back() * r.back()
                       + fit.parameters.beta * fit.variances(fit.variances.size() - 1);
    fit.evaluations = evaluations;
    if (fit.persistence >= 1.0 - 1e-6 || fit.parameters.alpha <= 1e-6 || fit.parameters.beta <= 1e-6)
        fit.outcome = FitOutcome::AtBound;
    else if (!converged)
        fit.outcome = FitOutcome::NotConverged;
    else
        fit.standardErrors = standardErrorsAt(r, fit.parameters);
    return fit;
}

double garchHorizonVariance(const GarchParameters &p, double nextVariance, int horizonDays)
{
    assert(horizonDays >= 1);
    const double phi = p.alpha + p.beta;
    assert(phi < 1.0);
    const double longRun = p.omega / (1.0 - phi);
    const double h = static_cast<double>(horizonDays);
    return h * longRun + (nextVariance - longRun) * (1.0 - std::pow(phi, h)) / (1.0 - phi);
}

std::string describe(FitOutcome outcome)
{
    switch (outcome) {
    case FitOutcome::Fitted: return "fitted";
    case FitOutcome::NoVariation: return "no variation";
    case FitOutcome::NotConverged: return "did not converge";
    case FitOutcome::AtBound: return "at a bound";
    }
    return "";
}

} // namespace tailwise
