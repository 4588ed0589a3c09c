// Allocation of VaR and ES to positions under every model: components that add up to the model's
// VaR and ES, each position's standalone VaR and ES under the same model, the undiversified VaR
// and the diversification benefit.
//
// Notation: e exposures (money), Σ the daily covariance, Σe and σ_p = √(eᵀΣe) the portfolio's
// daily P&L standard deviation, μ the daily means, H the horizon, C the confidence, α = 1 − C.
// Every function takes exposures, Σe, σ_p and the positions' own daily standard deviations (or a
// scenario matrix), never the covariance matrix itself.
//
// Common to all models:
//   marginal_i        = c_i / e_i  (∂VaR/∂e_i where VaR is differentiable; 0 when e_i = 0)
//   undiversified VaR = Σ_i standalone VaR_i
//   diversification   = undiversified VaR − the model's VaR. It can be negative: VaR is not
//                       subadditive outside the elliptical models (Artzner, Delbaen, Eber & Heath
//                       (1999), "Coherent measures of risk", Math. Finance 9(3)), and a negative
//                       benefit says so.
//
// Elliptical (normal, Student-t): VaR = k_V √H σ_p − H μᵀe, ES = k_E √H σ_p − H μᵀe, and Euler's
// theorem (VaR is homogeneous of degree one in e) gives
//   c_i  = e_i (Σe)_i/σ_p · k_V √H − H μ_i e_i,     ES_i likewise with k_E
//   standalone_i = k_V √H σ_i |e_i| − H μ_i e_i
// normal: k_V = Φ⁻¹(C), k_E = φ(k_V)/α (contributions.h; McNeil, Frey & Embrechts (2005) §6.3).
// Student-t: k_V = t_ν⁻¹(C)·√((ν−2)/ν), k_E the t ES factor (studentt.h), so the t allocation is
// the normal allocation with the normal factor replaced by the t factor. With ν fitted to the
// portfolio's kurtosis, ν is held fixed in the derivative (the allocation of the t model with
// that ν); a holding's standalone figure uses the same ν.
//
// Cornish–Fisher (cornishfisher.h): VaR = f_V(S, K) √H σ_p − H μᵀe with f_V = −z_cf(Φ⁻¹(α)),
// and ES = f_E(S, K) √H σ_p − H μᵀe with f_E = −(1/α) ∫_{−∞}^{a} z_cf(z) φ(z) dz, a = Φ⁻¹(α).
// The exact Euler derivative, including the derivatives of the skewness S and excess kurtosis K
// of the window's daily P&L p_t = Σ_i e_i r_{i,t} with respect to the exposures (Boudt, Peterson
// & Croux (2008), "Estimation and decomposition of downside risk for portfolios with non-normal
// returns", Journal of Risk 11(2), 79–103, the modified-VaR component formula):
//   c_i = e_i [ f_V √H (Σe)_i/σ_p + √H σ_p (∂f_V/∂S ∂S/∂e_i + ∂f_V/∂K ∂K/∂e_i) − H μ_i ]
// The co-moment derivatives are taken in returns space from the centred window, never forming the
// N×N² co-moment matrices: with p̃_t = p_t − p̄, r̃_{i,t} = r_{i,t} − r̄_i and m_k = (1/n) Σ_t p̃_t^k,
//   ∂m_2/∂e_i = (2/n) Σ_t r̃_{i,t} p̃_t,  ∂m_3/∂e_i = (3/n) Σ_t r̃_{i,t} p̃_t²,  ∂m_4/∂e_i = (4/n) Σ_t r̃_{i,t} p̃_t³
//   ∂S/∂e_i = ∂m_3/m_2^{3/2} − (3/2) m_3 ∂m_2/m_2^{5/2},   ∂K/∂e_i = ∂m_4/m_2² − 2 m_4 ∂m_2/m_2³
// (the same as Boudt et al.'s 3 M_3 (w⊗w) and 4 M_4 (w⊗w⊗w) for the co-moment matrices).
//   ∂f_V/∂S = −[(a²−1)/6 − (2a³−5a) S/18],   ∂f_V/∂K = −(a³−3a)/24
// ES components: by differentiating the model's own ES integral (not Boudt et al.'s Edgeworth
// ES, which is a different ES). The Hermite identity ∫_{−∞}^a He_n φ = −He_{n−1}(a) φ(a) gives
//   f_E = φ(a)/α · [1 + a S/6 + (a²−1) K/24 − (2a²−1) S²/36]
//   ∂f_E/∂S = φ(a)/α · [a/6 − (2a²−1) S/18],   ∂f_E/∂K = φ(a)/α · (a²−1)/24
// and the ES components have the same form with f_E. S and K are homogeneous of degree zero in
// e, so Σ_i e_i ∂S/∂e_i = Σ_i e_i ∂K/∂e_i = 0 and the components add up to VaR and ES.
// Standalone: the model on the holding's own P&L e_i r_{i,t}, with its own skewness and kurtosis.
// Multi-day scaling `aggregate` uses S/√H and K/H (and their derivatives scaled alike).
//
// Scenario models (historical, and any model given as scenarios × positions P&L P, money; Monte
// Carlo in simulate.h by the same definitions): L_t = −Σ_i P_{t,i}, VaR the type 7 C-quantile of
// L and ES the mean of {L_t ≥ VaR} (historical.h).
//   component ES_i  = mean over {t : L_t ≥ VaR} of −P_{t,i}
//     exactly additive to ES (Acerbi & Tasche (2002), "On the coherence of expected shortfall",
//     J. Banking & Finance 26; Tasche (1999), "Risk contributions and performance measurement")
//   component VaR_i = VaR · Σ_t w_t (−P_{t,i}) / Σ_t w_t L_t,  w_t = φ((L_t − VaR)/b),
//     b = 1.06 s_L n^(−1/5) (Silverman's rule; s_L the sample standard deviation of the losses,
//     divisor n − 1; n scenarios): a kernel estimate of E[−P_i | L = VaR] (Gourieroux, Laurent &
//     Scaillet (2000), "Sensitivity analysis of values at risk", J. Empirical Finance 7;
//     Epperlein & Smillie (2006), "Cracking VaR with kernels", Risk 19(8)), normalised so that the
//     components add up to VaR exactly. When the losses have no spread (b = 0) or Σ w_t L_t = 0,
//     VaR is split in proportion to the ES components, with a warning.
//   standalone_i: the type 7 VaR and the tail mean of the position's own losses −P_{t,i}.
// Every figure is multiplied by `scale` (√H under square-root-of-time scaling; 1 when the
// scenarios already are H-day sums, `--hs-horizon overlapping`).
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/multidayscaling.h"
#include "tailwise/parametric.h"
#include "tailwise/result.h"
#include "tailwise/shape.h"

#include <Eigen/Core>

#include <optional>

namespace tailwise {

struct Allocation {
    Eigen::VectorXd marginalVar;   // c_i / e_i, per unit of money exposure
    Eigen::VectorXd componentVar;  // money; Σ = VaR
    Eigen::VectorXd componentEs;   // money; Σ = ES
    Eigen::VectorXd standaloneVar; // money
    Eigen::VectorXd standaloneEs;  // money
    VarEs total;                   // the VaR and ES the components add up to
    double undiversifiedVar = 0.0;
    double diversificationBenefit = 0.0; // may be negative (see above)
    Warnings warnings;
};

// Fills marginal, undiversified and diversification from the components and standalone figures.
void finishAllocation(Allocation &a, const Eigen::VectorXd &exposures);

// Normal and Student-t: factors k_V, k_E as above. sd_i = √Σ_ii.
Allocation ellipticalAllocation(const Eigen::VectorXd &exposures, const Eigen::VectorXd &sigmaE, double sigmaP,
                                const Eigen::VectorXd &sd, const Eigen::VectorXd &mean, int horizonDays,
                                double varFactor, double esFactor);

// The Cornish–Fisher shape under a multi-day scaling convention: S/√H, K/H for aggregate.
Shape scaledShape(Shape daily, int horizonDays, MultiDayScaling scaling);

// Cornish–Fisher. `returns` the window's daily returns (days × positions), as the model's S and K
// are estimated from. Precondition: the portfolio's P&L has a shape (momentShape is not nullopt).
Allocation cornishFisherAllocation(const Eigen::VectorXd &exposures, const Eigen::VectorXd &sigmaE, double sigmaP,
                                   const Eigen::VectorXd &sd, const Eigen::VectorXd &mean,
                                   const Eigen::MatrixXd &returns, int horizonDays, double confidence,
                                   MultiDayScaling scaling);

// Any scenario model: `pnl` is scenarios × positions P&L in money (≥ 2 scenarios). The totals are
// those of L = −pnl·1, so the model's figures should be taken from `total`. The positions need
// not be holdings (factors, groups): marginalVar is left empty — finishAllocation(a, exposures)
// fills it where positions have exposures.
Allocation scenarioAllocation(const Eigen::MatrixXd &pnl, double confidence, double scale);

// The historical scenarios: daily P&L R·diag(e) (SquareRoot, or horizon 1), or each column's sums
// of H consecutive days (Overlapping). Precondition for Overlapping: returns.rows() ≥ H + 1.
Eigen::MatrixXd historicalScenarioPnl(const Eigen::MatrixXd &returns, const Eigen::VectorXd &exposures,
                                      int horizonDays, HistoricalHorizon method);

// Kernel weights' bandwidth: b = 1.06 s_L n^(−1/5) (Silverman 1986, eq. 3.28; s_L with divisor n − 1).
double silvermanBandwidth(const Eigen::VectorXd &losses);

} // namespace tailwise
