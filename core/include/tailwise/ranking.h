// Ranking VaR–ES models by a joint scoring function, with a Diebold–Mariano test against the best.
//
// Score: the FZ0 loss of Patton, Ziegel & Chen (2019), "Dynamic semiparametric models for expected
// shortfall (and Value-at-Risk)", Journal of Econometrics 211(2), 388–413, a member of the family
// that Fissler & Ziegel (2016), "Higher order elicitability and Osband's principle", Annals of
// Statistics 44(4), 1680–1707, show to be consistent for (VaR, ES). In the returns convention,
// with Y the P&L and v, e its α-quantile and ES (both negative):
//   FZ0(Y, v, e) = −1{Y ≤ v}(v − Y)/(α e) + v/e + ln(−e) − 1.
// With losses L = −Y, VaR = −v and ES = −e positive and α = 1 − C this reads
//   S = 1{L ≥ VaR}·(L − VaR)/(α·ES) + VaR/ES + ln(ES) − 1,
// defined for ES > 0. Lower is better; a model's score is the mean of S over every backtest day.
//
// Diebold & Mariano (1995), "Comparing predictive accuracy", Journal of Business & Economic
// Statistics 13(3), 253–263: with d_t = S_model,t − S_best,t over the T common days,
//   DM = d̄ / se,  se = √(V̂ / T),
//   V̂ = γ̂_0 + 2 Σ_{l=1}^{L} (1 − l/(L+1)) γ̂_l,  γ̂_l = (1/T) Σ_{t=l+1}^{T} (d_t − d̄)(d_{t−l} − d̄),
// the Newey & West (1987) (Econometrica 55(3), 703–708) variance with Bartlett weights and lag
// L = ⌊T^{1/3}⌋ (the largest whole L with L³ ≤ T). Positive DM: worse than the best. Two-sided
// p-value 2(1 − Φ(|DM|)). The best model's own row, and any model whose d_t has no variance,
// has DM = 0 and p-value 1.
#pragma once

#include "tailwise/result.h"

#include <span>
#include <string>
#include <vector>

namespace tailwise {

// S above; precondition es > 0, 0 < alpha < 1.
double fz0Score(double loss, double var, double es, double alpha);

struct DieboldMariano {
    double statistic = 0.0;
    double pValue = 1.0;
    int lag = 0;
};

// Newey–West lag ⌊T^{1/3}⌋.
int neweyWestLag(int observations);
// DM of the differences d; precondition: d not empty.
DieboldMariano dieboldMariano(std::span<const double> d);

struct RankingInput {
    std::string model;
    std::vector<double> losses, vars, ess; // one per backtest day, the same days for every model
};

struct RankingRow {
    std::string model;
    double fz0 = 0.0;          // mean score
    double dmStatistic = 0.0;  // against the best
    double dmPValue = 1.0;
};

// Rows best first (lowest mean FZ0). Errors: Assumption (field "compare") when a model has a day
// with ES ≤ 0 (naming the model and the day's index), when the models' day counts differ, or when
// there are none.
Result<std::vector<RankingRow>> rankByFz0(std::span<const RankingInput> models, double confidence);

} // namespace tailwise
