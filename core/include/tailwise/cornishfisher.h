// Cornish–Fisher Value-at-Risk and Expected Shortfall: the normal quantile corrected for the
// skewness and excess kurtosis of the portfolio's daily P&L.
//
// Expansion of the p-quantile of a standardised variable with skewness S and excess kurtosis K,
// z = Φ⁻¹(p):
//   z_cf(z) = z + (z²−1) S/6 + (z³−3z) K/24 − (2z³−5z) S²/36
// (Cornish & Fisher (1937), "Moments and cumulants in the specification of distributions",
// Rev. Inst. Int. Statist. 5, 307–320; the terms γ₁h₁ + γ₂h₂ + γ₁²h₁₁ of Abramowitz & Stegun
// 26.2.49–26.2.51.)
//
// S and K are the moment estimates (shape.h) of the window's daily P&L p_t = Σ e_i r_{i,t}. The
// loss quantile lies in the P&L's lower tail, p = α = 1 − C, so with σ_h, μ_h of risk.h:
//   VaR = −z_cf(Φ⁻¹(α)) σ_h − μ_h
// (a negatively skewed P&L, S < 0, makes VaR larger than the normal's; S = K = 0 gives back the
// normal exactly).
//
// ES: the mean loss beyond VaR, taking z_cf as the quantile function of the standardised P&L:
//   ES = −(1/α) ∫₀^α z_cf(Φ⁻¹(u)) du · σ_h − μ_h = −(1/α) ∫_{−∞}^{Φ⁻¹(α)} z_cf(z) φ(z) dz · σ_h − μ_h
// computed numerically by adaptive Gauss–Kronrod quadrature (61 points, Boost.Math, on the
// infinite interval through Boost's variable change; relative tolerance 1e-12). The tests check it
// against the closed form that the Hermite identity ∫_{−∞}^a He_n φ = −He_{n−1}(a) φ(a) gives.
//
// Monotonicity: z_cf is a valid quantile function only where it increases. Its derivative
//   z_cf'(z) = A z² + B z + C,  A = K/8 − S²/6,  B = S/3,  C = 1 − K/8 + 5S²/36
// is never negative exactly when A > 0 and B² ≤ 4AC (or A = B = 0 < C); it is then zero at one
// point at most, so z_cf still strictly increases. Outside that set a warning says the expansion
// is not monotone, and ES is reported as max(ES_cf, VaR_cf): the fallback that keeps ES ≥ VaR.
// Preconditions: 0.5 ≤ C ≤ 0.9999. (Domain: Maillard 2012, SSRN 1997178, §3; from memory.)
#pragma once

#include "tailwise/parametric.h"
#include "tailwise/shape.h"

namespace tailwise {

double cornishFisherZ(double z, Shape shape);
// True when z_cf increases on the whole real line (see above).
bool cornishFisherMonotone(Shape shape);

struct CornishFisherFactors {
    double var = 0.0; // −z_cf(Φ⁻¹(α)): loss quantile of the standardised P&L
    double es = 0.0;  // −(1/α) ∫ z_cf φ over the tail
    bool monotone = true;
};

CornishFisherFactors cornishFisherFactors(double confidence, Shape shape);
VarEs cornishFisherVarEs(HorizonMoments horizon, double confidence, Shape shape);

} // namespace tailwise
