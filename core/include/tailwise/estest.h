// Expected Shortfall backtest: Acerbi & Székely's test 2, with its p-value by simulation.
//
// Source: Acerbi & Székely (2014), "Backtesting Expected Shortfall", Risk, December, 76–81
// (test 2, the unconditional test). With L_t the day's loss (positive), VaR_t and ES_t that day's
// forecasts (positive = loss), I_t = 1{L_t > VaR_t} (the backtest's exception) and α = 1 − C:
//   Z₂ = 1 − Σ_t L_t I_t / (T · α · ES_t)
// Z₂ is 0 in expectation when the model is right and negative when the tail was heavier than ES
// said. Its p-value is one-sided, p = P(Z₂* ≤ Z₂) under the model, estimated from M simulations:
// simulation m draws every day's loss L*_t from that day's model distribution, sets
// I*_t = 1{L*_t > VaR_t} and forms Z₂* the same way; p = #{Z₂*_m ≤ Z₂} / M.
// How each model's distribution is drawn (u uniform on (0, 1), μ, σ the day's P&L mean and sd):
//   normal, garch-normal   L* = −μ + σ Φ⁻¹(u)
//   student-t              L* = −μ + σ s_ν t_ν⁻¹(u),  s_ν = √((ν−2)/ν)       (studentt.h)
//   cornish-fisher         L* = −μ − σ z_cf(Φ⁻¹(1 − u))                        (cornishfisher.h)
//   historical, filtered   L* = one of that day's window scenario losses, each with probability 1/W
// For the parametric families only draws with u > C can exceed VaR_t = Q_t(C), so the quantile is
// evaluated for those alone. Simulation m draws from its own std::mt19937_64 seeded with
// blockSeed(seed, m) (simulate.h): the p-value depends on the seed and M only.
// Verdict at the 5% test size: rejected when p < 0.05 (the losses beyond VaR were larger than the
// ES forecasts said).
#pragma once

#include "tailwise/result.h"
#include "tailwise/shape.h"

#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace tailwise {

// One day's model distribution of the loss.
struct LossDistribution {
    enum class Kind { Normal, StudentT, CornishFisher, Empirical };
    Kind kind = Kind::Normal;
    double mean = 0.0;          // μ of the P&L (money)
    double sd = 0.0;            // σ of the P&L (money)
    double dof = 0.0;           // ν (student-t)
    Shape shape;                // cornish-fisher
    std::vector<double> losses; // empirical: the window scenario losses
};

struct EsTestDay {
    double loss = 0.0; // L_t
    double var = 0.0;  // VaR_t
    double es = 0.0;   // ES_t, > 0
};

struct EsTestResult {
    double z2 = 0.0;
    double pValue = 1.0;
    int simulations = 0;
    std::uint64_t seed = 1;
    bool rejected = false;     // p < 0.05
    std::string verdict;       // in words
    std::string drawing;       // how the model's distribution was drawn, in words
};

inline constexpr int defaultEsTestSimulations = 10000;

// Z₂ of the days; precondition: not empty, every ES_t > 0, 0 < C < 1.
double acerbiSzekelyZ2(std::span<const EsTestDay> days, double confidence);

// Z₂ and its simulated p-value. Errors: Assumption (field "es-test") when a day's ES is not
// positive or the sizes differ, or fewer than 100 simulations are asked for.
Result<EsTestResult> esTest(std::span<const EsTestDay> days, std::span<const LossDistribution> models,
                            double confidence, int simulations, std::uint64_t seed);

} // namespace tailwise
