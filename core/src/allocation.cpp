#include "tailwise/allocation.h"

#include "tailwise/cornishfisher.h"
#include "tailwise/historical.h"

#include <boost/math/distributions/normal.hpp>

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>
#include <span>

namespace tailwise {

std::string_view toName(MultiDayScaling v) { return v == MultiDayScaling::SquareRoot ? "sqrt" : "aggregate"; }

std::optional<MultiDayScaling> parseMultiDayScaling(std::string_view n)
{
    if (n == "sqrt")
        return MultiDayScaling::SquareRoot;
    if (n == "aggregate")
        return MultiDayScaling::Aggregate;
    return std::nullopt;
}

double aggregateDof(double dailyDof, int horizonDays)
{
    if (!(dailyDof > 4.0))
        return dailyDof;
    return std::min(4.0 + static_cast<double>(horizonDays) * (dailyDof - 4.0), 1e6);
}

void finishAllocation(Allocation &a, const Eigen::VectorXd &e)
{
    a.marginalVar.resize(e.size());
    for (Eigen::Index i = 0; i < e.size(); ++i)
        a.marginalVar(i) = e(i) != 0.0 ? a.componentVar(i) / e(i) : 0.0;
    a.undiversifiedVar = a.standaloneVar.sum();
    a.diversificationBenefit = a.undiversifiedVar - a.total.var;
}

Allocation ellipticalAllocation(const Eigen::VectorXd &e, const Eigen::VectorXd &sigmaE, double sigmaP,
                                const Eigen::VectorXd &sd, const Eigen::VectorXd &mean, int horizonDays,
                                double kVar, double kEs)
{
    const double h = static_cast<double>(horizonDays);
    const double rootH = std::sqrt(h);
    const Eigen::VectorXd direction = sigmaP > 0.0 ? Eigen::VectorXd(sigmaE / sigmaP) : Eigen::VectorXd::Zero(e.size());
    const Eigen::VectorXd drift = h * mean.cwiseProduct(e);
    const Eigen::VectorXd spreadPart = rootH * e.cwiseProduct(direction);
    Allocation a;
    a.componentVar = kVar * spreadPart - drift;
    a.componentEs = kEs * spreadPart - drift;
    const Eigen::VectorXd own = rootH * sd.cwiseProduct(e.cwiseAbs());
    a.standaloneVar = kVar * own - drift;
    a.standaloneEs = kEs * own - drift;
    const double driftTotal = h * mean.dot(e);
    a.total = VarEs{kVar * rootH * sigmaP - driftTotal, kEs * rootH * sigmaP - driftTotal};
    finishAllocation(a, e);
    return a;
}

Shape scaledShape(Shape daily, int horizonDays, MultiDayScaling scaling)
{
    if (scaling == MultiDayScaling::SquareRoot)
        return daily;
    const double h = static_cast<double>(horizonDays);
    return Shape{daily.skewness / std::sqrt(h), daily.excessKurtosis / h};
}

namespace {

struct CfFactorDerivatives {
    double var = 0.0, varS = 0.0, varK = 0.0; // f_V and its partials
    double es = 0.0, esS = 0.0, esK = 0.0;    // f_E (the model's quadrature) and its partials
};

CfFactorDerivatives cfDerivatives(double confidence, Shape s)
{
    const double alpha = 1.0 - confidence;
    const boost::math::normal standard;
    const double a = boost::math::quantile(standard, alpha);
    const double phi = boost::math::pdf(standard, a);
    const CornishFisherFactors f = cornishFisherFactors(confidence, s);
    CfFactorDerivatives d;
    d.var = f.var;
    d.varS = -((a * a - 1.0) / 6.0 - (2.0 * a * a * a - 5.0 * a) * s.skewness / 18.0);
    d.varK = -(a * a * a - 3.0 * a) / 24.0;
    d.es = f.es;
    d.esS = phi / alpha * (a / 6.0 - (2.0 * a * a - 1.0) * s.skewness / 18.0);
    d.esK = phi / alpha * (a * a - 1.0) / 24.0;
    return d;
}

// VaR and ES factors of a position alone (own shape), or the normal's when it has none.
VarEs ownCfFactors(const Eigen::VectorXd &ownPnl, double confidence, int horizonDays, MultiDayScaling scaling)
{
    const auto shape = momentShape(std::span<const double>(ownPnl.data(), static_cast<std::size_t>(ownPnl.size())));
    const Shape s = shape ? scaledShape(*shape, horizonDays, scaling) : Shape{};
    const CornishFisherFactors f = cornishFisherFactors(confidence, s);
    return VarEs{f.var, f.es};
}

} // namespace

Allocation cornishFisherAllocation(const Eigen::VectorXd &e, const Eigen::VectorXd &sigmaE, double sigmaP,
                                   const Eigen::VectorXd &sd, const Eigen::VectorXd &mean, const Eigen::MatrixXd &returns,
                                   int horizonDays, double confidence, MultiDayScaling scaling)
{
    const double h = static_cast<double>(horizonDays);
    const double rootH = std::sqrt(h);
    const auto n = static_cast<double>(returns.rows());
    // Centred window and P&L.
    const Eigen::RowVectorXd returnMean = returns.colwise().mean();
    const Eigen::MatrixXd centred = returns.rowwise() - returnMean;
    const Eigen::VectorXd p = centred * e;
    const Eigen::VectorXd p2 = p.cwiseProduct(p);
    const Eigen::VectorXd p3 = p2.cwiseProduct(p);
    const double m2 = p2.sum() / n, m3 = p3.sum() / n, m4 = p2.squaredNorm() / n;
    // ∂m_k/∂e_i in returns space: k/n Σ_t r̃_{i,t} p̃_t^{k−1}.
    const Eigen::VectorXd dm2 = (2.0 / n) * (centred.transpose() * p);
    const Eigen::VectorXd dm3 = (3.0 / n) * (centred.transpose() * p2);
    const Eigen::VectorXd dm4 = (4.0 / n) * (centred.transpose() * p3);
    Eigen::VectorXd dS = dm3 / std::pow(m2, 1.5) - 1.5 * m3 / std::pow(m2, 2.5) * dm2;
    Eigen::VectorXd dK = dm4 / (m2 * m2) - 2.0 * m4 / (m2 * m2 * m2) * dm2;
    Shape daily{m3 / std::pow(m2, 1.5), m4 / (m2 * m2) - 3.0};
    if (scaling == MultiDayScaling::Aggregate) {
        dS /= rootH;
        dK /= h;
    }
    const Shape s = scaledShape(daily, horizonDays, scaling);
    const CfFactorDerivatives d = cfDerivatives(confidence, s);

    const Eigen::VectorXd direction = sigmaP > 0.0 ? Eigen::VectorXd(sigmaE / sigmaP) : Eigen::VectorXd::Zero(e.size());
    const Eigen::VectorXd drift = h * mean.cwiseProduct(e);
    const double sigmaH = rootH * sigmaP;
    Allocation a;
    a.componentVar = e.cwiseProduct(d.var * rootH * direction + sigmaH * (d.varS * dS + d.varK * dK)) - drift;
    a.componentEs = e.cwiseProduct(d.es * rootH * direction + sigmaH * (d.esS * dS + d.esK * dK)) - drift;
    const double driftTotal = h * mean.dot(e);
    a.total = VarEs{d.var * sigmaH - driftTotal, d.es * sigmaH - driftTotal};
    a.standaloneVar.resize(e.size());
    a.standaloneEs.resize(e.size());
    for (Eigen::Index i = 0; i < e.size(); ++i) {
        const Eigen::VectorXd own = e(i) * returns.col(i);
        const VarEs f = ownCfFactors(own, confidence, horizonDays, scaling);
        const double spread = rootH * sd(i) * std::abs(e(i));
        a.standaloneVar(i) = f.var * spread - drift(i);
        a.standaloneEs(i) = f.es * spread - drift(i);
    }
    finishAllocation(a, e);
    return a;
}

double silvermanBandwidth(const Eigen::VectorXd &losses)
{
    const auto n = static_cast<double>(losses.size());
    if (losses.size() < 2)
        return 0.0;
    const double mean = losses.mean();
    const double sL = std::sqrt((losses.array() - mean).square().sum() / (n - 1.0));
    return 1.06 * sL * std::pow(n, -0.2);
}

Allocation scenarioAllocation(const Eigen::MatrixXd &pnl, double confidence, double scale)
{
    assert(pnl.rows() >= 2);
    const Eigen::Index n = pnl.rows(), m = pnl.cols();
    const Eigen::VectorXd losses = -pnl.rowwise().sum();
    const std::span<const double> lossSpan(losses.data(), static_cast<std::size_t>(n));
    const VarEs total = empiricalVarEs(lossSpan, confidence);

    Allocation a;
    // Component ES: the tail mean of each position's loss.
    Eigen::VectorXd tailSum = Eigen::VectorXd::Zero(m);
    int tailCount = 0;
    for (Eigen::Index t = 0; t < n; ++t)
        if (losses(t) >= total.var) {
            tailSum -= pnl.row(t).transpose();
            ++tailCount;
        }
    a.componentEs = tailSum / static_cast<double>(tailCount);
    // Component VaR: Gaussian-kernel estimate of E[−P_i | L = VaR], normalised to add up to VaR.
    const double b = silvermanBandwidth(losses);
    bool kernelDone = false;
    if (b > 0.0) {
        const double norm = 1.0 / std::sqrt(2.0 * std::numbers::pi);
        Eigen::VectorXd w(n);
        for (Eigen::Index t = 0; t < n; ++t) {
            const double u = (losses(t) - total.var) / b;
            w(t) = norm * std::exp(-0.5 * u * u);
        }
        const double wl = w.dot(losses);
        if (wl != 0.0 && std::isfinite(wl)) {
            a.componentVar = total.var * (-(pnl.transpose() * w)) / wl;
            kernelDone = true;
        }
    }
    if (!kernelDone) {
        a.componentVar = total.es != 0.0 ? Eigen::VectorXd(a.componentEs * (total.var / total.es)) : Eigen::VectorXd::Zero(m);
        a.warnings.push_back("the scenario losses have no spread around the VaR, so the kernel estimate of each "
                             "holding's part of VaR is not defined: VaR is split in proportion to the holdings' parts of ES");
    }
    a.standaloneVar.resize(m);
    a.standaloneEs.resize(m);
    for (Eigen::Index i = 0; i < m; ++i) {
        const Eigen::VectorXd own = -pnl.col(i);
        const VarEs f = empiricalVarEs(std::span<const double>(own.data(), static_cast<std::size_t>(n)), confidence);
        a.standaloneVar(i) = f.var;
        a.standaloneEs(i) = f.es;
    }
    a.componentVar *= scale;
    a.componentEs *= scale;
    a.standaloneVar *= scale;
    a.standaloneEs *= scale;
    a.total = VarEs{total.var * scale, total.es * scale};
    a.undiversifiedVar = a.standaloneVar.sum();
    a.diversificationBenefit = a.undiversifiedVar - a.total.var;
    return a;
}

Eigen::MatrixXd historicalScenarioPnl(const Eigen::MatrixXd &returns, const Eigen::VectorXd &e, int horizonDays,
                                      HistoricalHorizon method)
{
    const Eigen::MatrixXd daily = returns * e.asDiagonal();
    if (method != HistoricalHorizon::Overlapping || horizonDays <= 1)
        return daily;
    const Eigen::Index rows = daily.rows() - horizonDays + 1;
    assert(rows >= 1);
    Eigen::MatrixXd out(rows, daily.cols());
    for (Eigen::Index k = 0; k < rows; ++k)
        out.row(k) = daily.middleRows(k, horizonDays).colwise().sum();
    return out;
}

} // namespace tailwise
