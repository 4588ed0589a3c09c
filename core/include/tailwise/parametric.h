// Parametric (variance–covariance) normal Value-at-Risk and Expected Shortfall.
//
// Losses are positive money. With horizon standard deviation σ_h and horizon mean P&L μ_h:
//   VaR = z σ_h − μ_h,         z = Φ⁻¹(C)
//   ES  = σ_h φ(z)/(1−C) − μ_h
// (Jorion, Value at Risk, the delta-normal method; McNeil, Frey & Embrechts, Quantitative Risk
// Management (2005) ch. 2 for the normal ES.) Φ⁻¹ and φ come from Boost.Math; the tail factor
// uses the complement form quantile(complement(N, 1−C)) so that C near 1 keeps its accuracy.
//
// Square-root-of-time (common practice, i.i.d. returns): σ_h = √H σ_1, μ_h = H μ_1.
//
// One position from a value V, an annual volatility S and an annual drift M with N trading days a
// year: σ_h = S √(H/N) · V, μ_h = M H/N · V.
#pragma once

#include "tailwise/result.h"

namespace tailwise {

// z = Φ⁻¹(C). Precondition 0 < C < 1.
double normalQuantile(double confidence);
// φ(z)/(1−C): the normal ES factor, mean of a standard normal beyond its C-quantile.
double normalTailMeanFactor(double confidence);

struct HorizonMoments {
    double mean = 0.0; // μ_h, money (expected P&L, gains positive)
    double sd = 0.0;   // σ_h, money
};

struct VarEs {
    double var = 0.0; // money, positive = loss
    double es = 0.0;  // money, positive = loss
};

VarEs normalVarEs(HorizonMoments moments, double confidence);

// The model's horizon P&L distribution N(μ_h, σ_h²), for drawing and read-outs (money in, money
// or probability out). Precondition σ_h > 0: with no spread there is no density to draw.
//   density:          φ((x − μ_h)/σ_h) / σ_h
//   probabilityBelow: P(P&L < x) = Φ((x − μ_h)/σ_h); the lower tail read directly, which keeps
//                     its accuracy far into the loss tail (Boost.Math cdf).
double normalPnlDensity(HorizonMoments moments, double pnl);
double normalPnlProbabilityBelow(HorizonMoments moments, double pnl);

struct SinglePosition {
    double value = 0.0;            // V, money
    double annualVolatility = 0.0; // S, fraction per year, ≥ 0
    double annualDrift = 0.0;      // M, fraction per year
};

// Errors: Assumption naming "volatility", "horizon", "days-per-year" for values out of domain.
Result<HorizonMoments> singlePositionMoments(const SinglePosition &position, int horizonDays,
                                             int daysPerYear);

} // namespace tailwise
