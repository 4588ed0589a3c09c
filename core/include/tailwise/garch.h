// GARCH(1,1) volatility of one factor's daily returns.
//
// Model (Bollerslev (1986), "Generalized autoregressive conditional heteroskedasticity", Journal
// of Econometrics 31, 307–327), zero mean:
//   r_t = σ_t z_t,   σ²_t = ω + α r²_{t−1} + β σ²_{t−1},   t = 2 … T,
//   σ²_1 = (1/T) Σ_t r²_t   (the window's mean of r², zero mean),
//   constraints ω > 0, α ≥ 0, β ≥ 0, α + β < 1.
// Fitted by Gaussian quasi-maximum likelihood (Bollerslev & Wooldridge (1992), Econometric
// Reviews 11(2), 143–172): maximise
//   ℓ(ω, α, β) = −½ Σ_{t=1}^{T} [ ln(2π) + ln σ²_t + r²_t / σ²_t ].
// The optimiser works on unconstrained coordinates that keep every constraint by construction,
//   ω = m·e^{x₀} (m = the window's mean of r²), α + β = φ = 1/(1 + e^{−x₁}), α = φ s, β = φ (1 − s),
//   s = 1/(1 + e^{−x₂}),
// with Nelder–Mead simplex searches (Nelder & Mead (1965), The Computer Journal 7(4), 308–313)
// from several starts, each restarted at its optimum until it stops improving, and a final
// search in (ω, α, β) itself. Standard errors are the square roots of the diagonal of the inverse
// of −∇²ℓ at the optimum (central differences), the usual information-matrix estimate under
// normal innovations.
//
// Forecasts from the last day T of the window:
//   σ²_{T+1} = ω + α r²_T + β σ²_T,
//   σ²_{T+h} = σ̄² + φ^{h−1} (σ²_{T+1} − σ̄²),   σ̄² = ω / (1 − φ),  φ = α + β,
//   H-day variance  V_H = Σ_{h=1}^{H} σ²_{T+h} = H σ̄² + (σ²_{T+1} − σ̄²)(1 − φ^H)/(1 − φ)
// (the closed form of the geometric sum; e.g. Christoffersen (2012), Elements of Financial Risk
// Management, ch. 4 (mem)). Persistence is φ.
//
// A fit is refused (FitOutcome says why; a caller then falls back to the EWMA variance) when the
// series has no variation (every r_t = 0), when the search does not converge, or when the optimum
// lies on a bound: α + β ≥ 1 − 1e-6, α ≤ 1e-6 or β ≤ 1e-6 (relative to the bound, so that a
// parameter at zero or a unit root is not reported as an interior estimate).
//
#pragma once

#include "tailwise/result.h"

#include <Eigen/Core>

#include <optional>
#include <span>
#include <string>

namespace tailwise {

struct GarchParameters {
    double omega = 0.0;
    double alpha = 0.0;
    double beta = 0.0;
};

enum class FitOutcome { Fitted, NoVariation, NotConverged, AtBound };

struct GarchFit {
    FitOutcome outcome = FitOutcome::Fitted;
    GarchParameters parameters;
    std::optional<GarchParameters> standardErrors; // when −∇²ℓ is positive definite
    double persistence = 0.0;                      // α + β
    double logLikelihood = 0.0;                    // ℓ at the parameters
    Eigen::VectorXd variances;                     // σ²_1 … σ²_T
    double nextVariance = 0.0;                     // σ²_{T+1}
    int evaluations = 0;                           // log-likelihood evaluations used
};

// ℓ(ω, α, β) as defined above, and the conditional variances into `variances` when given.
// Preconditions: returns not empty, ω > 0, α, β ≥ 0.
double garchLogLikelihood(std::span<const double> returns, const GarchParameters &p,
                          Eigen::VectorXd *variances = nullptr);

// Fits GARCH(1,1) by Gaussian QML. Never fails: a refused fit says why in `outcome`, with the
// best parameters found (zero for NoVariation).
GarchFit fitGarch(std::span<const double> returns);

// Σ_{h=1}^{H} σ²_{T+h}, the closed form above. Precondition: H ≥ 1, α + β < 1.
double garchHorizonVariance(const GarchParameters &p, double nextVariance, int horizonDays);

// σ²_{T+1} and the conditional variances for fixed parameters on a window (the backtest refits
// every few days and rolls these in between).
double garchNextVariance(std::span<const double> returns, const GarchParameters &p, Eigen::VectorXd *variances = nullptr);

// EWMA variances σ²_1 = mean r², σ²_t = λ σ²_{t−1} + (1 − λ) r²_{t−1}, and σ²_{T+1} (returned)
// (RiskMetrics Technical Document, J.P. Morgan 1996, §5.2 (mem), started at the window's mean
// square, zero mean).
double ewmaVariances(std::span<const double> returns, double lambda, Eigen::VectorXd *variances = nullptr);

// "fitted", "no variation", "did not converge", "at a bound".
std::string describe(FitOutcome outcome);

} // namespace tailwise
