// Monte Carlo Value-at-Risk and Expected Shortfall of a linear portfolio.
//
// Draws of the H-day return vector r ~ N(H μ, H Σ), or with ν degrees of freedom a multivariate
// t scaled to the same covariance, r = H μ + √H · s · L z / √(W/ν) with s = √((ν−2)/ν),
// W ~ χ²_ν independent of z ~ N(0, I) (McNeil, Frey & Embrechts (2005) §3.2, normal variance
// mixtures; (mem)), where Σ = L Lᵀ (Cholesky; for a semi-definite Σ the factor V D^{1/2} of its
// eigen-decomposition). The P&L of a draw is eᵀr; since eᵀ L z = (Lᵀe)ᵀ z, the factor is applied
// once to the exposures and each draw costs one dot product — the full return vector is never
// formed. VaR and ES of the simulated losses −eᵀr are those of historical.h (type 7 quantile, mean
// of the losses at or beyond VaR).
//
// Reproducibility: the draws are cut into fixed blocks of `blockSize` consecutive draws; block b
// has its own 64-bit Mersenne Twister (std::mt19937_64, whose output the C++ standard fixes)
// seeded from (seed, b) through the SplitMix64 mixer (Steele, Lea & Flood (2014), "Fast splittable
// pseudorandom number generators", OOPSLA; (mem)). Normals come from Marsaglia & Tsang's ziggurat
// with 256 layers (2000, J. Statistical Software 5(8) (mem)) — about one engine word per normal —
// and χ² from Marsaglia & Tsang's gamma method (2000, ACM TOMS 26(3), 363–372 (mem)), both written
// here rather than taken from <random>'s implementation-defined distributions. Each draw is stored
// at its own index, so the figures are identical for any number of threads, and identical for the
// same seed and inputs.
//
// Standard error of the VaR by batch means: the draws in draw order are split into 20 equal batches,
// each batch's VaR is computed the same way, and SE = sd(batch VaRs)/√20 (e.g. Glasserman (2003),
// Monte Carlo Methods in Financial Engineering, §9.1 on quantile estimation (mem); the batch
// method is common practice). The ES standard error is given the same way.
//
// Allocation (SimulationSettings::allocate): a second pass replays every block's seeded stream
// and accumulates, per draw k with kernel weight w_k and tail indicator, the standard vector
// g_k z_k (g_k = 1, or s/√(W_k/ν) for t draws); with F the factor above (Σ = F Fᵀ) a holding's
// P&L in draw k is P_{k,i} = e_i (H μ_i + √H g_k (F z_k)_i), so the kernel and tail sums of
// allocation.h's scenario definitions are e_i (H μ_i Σ_k w_k + √H (F Σ_k w_k g_k z_k)_i) — exactly
// those definitions over the draws, without forming the draws × holdings matrix. Standalone
// figures: the model on each holding alone with the same seed, which is |e_i| σ_i times the VaR
// (ES) of a unit one-asset book (long, or short for e_i < 0) minus H μ_i e_i, since the type 7
// quantile and the tail mean follow positive affine maps; two one-asset simulations give them all.
//
// The grid (grid.h) reuses one set of standard draws y_k = g_k bᵀz_k (simulateStandardPnl); the
// H-day loss of draw k is −(H eᵀμ + √H y_k) at every horizon.
//
// Errors: Cancelled when the stop token is triggered; Assumption (field "simulations") when fewer
// than 1000 draws are asked for. Preconditions: Σ symmetric positive semi-definite, sizes agree,
// 0 < C < 1, H ≥ 1, ν > 2 when given.
#pragma once

#include "tailwise/allocation.h"
#include "tailwise/parametric.h"
#include "tailwise/result.h"
#include "tailwise/runcontrol.h"

#include <Eigen/Core>

#include <cstdint>
#include <optional>
#include <string>

namespace tailwise {

struct SimulationSettings {
    int simulations = 100000;
    std::uint64_t seed = 1;
    std::optional<double> dof; // t draws with ν > 2; normal when unset
    bool allocate = false;     // also components and standalone figures (see above)
};

struct SimulationFigures {
    VarEs figures;
    double varStandardError = 0.0; // money
    double esStandardError = 0.0;  // money
    std::string standardErrorMethod; // a sentence naming the method, for reports
    int simulations = 0;
    int blocks = 0;
    std::optional<Allocation> allocation; // when SimulationSettings::allocate
    Warnings warnings;
};

inline constexpr int simulationBlockSize = 8192;
inline constexpr int simulationBatches = 20;

// The seed of block b's engine (SplitMix64 of the seed and the block index).
std::uint64_t blockSeed(std::uint64_t seed, std::uint64_t block);

Result<SimulationFigures> simulateVarEs(const Eigen::VectorXd &exposures, const Eigen::MatrixXd &covariance,
                                        const Eigen::VectorXd &mean, int horizonDays, double confidence,
                                        const SimulationSettings &settings, const RunControl &control = {});

// The standard portfolio draws y_k = g_k bᵀz_k (no drift, no √H) in draw order: the losses of
// simulateVarEs at horizon H are −(H eᵀμ + √H y_k). Errors as simulateVarEs.
Result<Eigen::VectorXd> simulateStandardPnl(const Eigen::VectorXd &exposures, const Eigen::MatrixXd &covariance,
                                            const SimulationSettings &settings, const RunControl &control = {});

} // namespace tailwise
