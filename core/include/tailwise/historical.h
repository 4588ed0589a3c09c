// Historical-simulation Value-at-Risk and Expected Shortfall: today's exposures replayed over the
// window's daily returns.
//
// Losses L_t = −p_t with p_t = Σ_i e_i r_{i,t} (money, shape.h's dailyPnl). The one-day VaR is the
// empirical C-quantile of L by linear interpolation between order statistics, Hyndman & Fan
// (1996) definition 7 ("Sample quantiles in statistical packages", The American Statistician
// 50(4), 361–365; NumPy's default, numpy.quantile(..., method="linear")): with the losses sorted
// x_(0) ≤ … ≤ x_(n−1) and h = (n−1) C,
//   Q(C) = x_(⌊h⌋) + (h − ⌊h⌋)(x_(⌊h⌋+1) − x_(⌊h⌋))
// ES is the mean of the losses at or beyond the VaR, {L_t : L_t ≥ VaR} (always at least the
// largest loss, so never empty). No mean adjustment: the sample carries its own mean.
//
// Horizon H:
//   sqrt         VaR_H = √H VaR_1, ES_H = √H ES_1 (common practice; exact only for i.i.d. zero-mean
//                normal P&L)
//   overlapping  the same quantile and tail mean over the n−H+1 sums of H consecutive daily P&L
//                (overlapping windows, so the sums are strongly dependent: fewer distinct
//                observations than it seems; a warning says so).
// Errors: InsufficientData (field "horizon") when fewer than 2 H-day sums are available.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/parametric.h"
#include "tailwise/result.h"

#include <Eigen/Core>

#include <span>

namespace tailwise {

// Hyndman–Fan type 7 quantile of a sample at probability p ∈ [0, 1]. The sample is copied, not
// sorted in place. Precondition: sample not empty.
double empiricalQuantile(std::span<const double> sample, double p);
// Mean of the values ≥ threshold; precondition: at least one such value.
double tailMean(std::span<const double> sample, double threshold);
// VaR and ES of a sample of losses at confidence C (type 7 quantile and tail mean, as above).
VarEs empiricalVarEs(std::span<const double> losses, double confidence);

// Sums of `days` consecutive values: out[k] = Σ_{j<days} x[k+j], k = 0 … n−days.
Eigen::VectorXd overlappingSums(const Eigen::VectorXd &x, int days);

struct HistoricalFigures {
    VarEs figures;
    int scenarios = 0; // number of losses the quantile was taken over
    Warnings warnings;
};

Result<HistoricalFigures> historicalVarEs(const Eigen::VectorXd &dailyPnl, int horizonDays, double confidence,
                                          HistoricalHorizon method);

} // namespace tailwise
