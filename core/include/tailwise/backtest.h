// Backtest of one-day VaR with static holdings: would the model's forecasts have held up?
//
// Definition. Price history P_0 … P_T (rows = dates), holdings fixed over the whole history, a
// window of W returns. For every day t = W+1 … T (each day that has W returns before it):
//   exposures   e_t,i = quantity_i × P_{t−1,i}   (the close before the day; static quantities), or
//               e_t,i = value_i                  (a holding given by value keeps a constant money
//                                                 exposure, i.e. it is rebalanced to that value
//                                                 every day);
//   forecast    VaR_t, the one-day VaR of exposures e_t at confidence C, estimated from the W
//               returns r_{t−W} … r_{t−1} with the chosen model, estimator, λ and mean;
//   realised    P&L_t = Σ_i e_t,i r_t,i with simple returns r_t,i = P_t,i/P_{t−1,i} − 1 (the
//               money the fixed holdings actually made or lost that day);
//   exception   I_t = 1 when the loss is strictly greater than the forecast: −P&L_t > VaR_t.
// The hit sequence then goes through coveragetests.h: Kupiec (1995) proportion of failures,
// Christoffersen (1998) independence and conditional coverage, and the traffic-light zone of the
// Basel Committee (1996) at p = 1 − C, with T_obs = T − W observations and expected exceptions
// p·T_obs.
//
// The forecast's returns follow the assumptions' return type: with log returns the model is
// estimated on ln(P_t/P_{t−1}) and applied to the money exposures as `tailwise-cli var` does
// (r ≈ ln(1+r) for daily moves); the realised P&L is always the simple-return P&L above, since
// that is what the holdings made. A price override in the holdings is not used: it values today's
// holding, while the backtest values each past day at its own close.
//
// Estimates roll incrementally (rollingmoments.h): each day adds the newest return and drops the
// oldest; nothing is refitted from scratch except the exact re-synchronisations described there.
//
// Models plug in through forecastOneDayVar(), each as `tailwise-cli var` computes its one-day VaR,
// with σ_t = √(e_tᵀ Σ_t e_t), μ_t = e_tᵀ μ_t from the rolling estimates and p_s = e_t · r_s the
// window's daily P&L at today's exposures (shape.h):
//   normal          VaR_t = z σ_t − μ_t, z = Φ⁻¹(C)                                  (parametric.h)
//   student-t       VaR_t = s_ν t_ν⁻¹(C) σ_t − μ_t; ν as given, or fitted each day by the
//                   kurtosis of p (ν = 4 + 6/K)                                       (studentt.h)
//   cornish-fisher  VaR_t = −z_cf(Φ⁻¹(1−C)) σ_t − μ_t with the skewness and excess kurtosis of p
//                                                                                     (cornishfisher.h)
//   historical      VaR_t = the type-7 empirical C-quantile of the losses −p          (historical.h)
// Where a day's window cannot be fitted (P&L without spread; for a fitted Student-t, excess
// kurtosis ≤ 0) that day uses the normal model, as `var` does, and a warning counts such days.
// Monte Carlo is not backtested (a simulation per day): it is refused before any work with an
// Error whose field is "model", as any model the backtest does not support.
//
// Assumptions used: window (required, 2 ≤ W < number of returns), confidence, returns, estimator,
// lambda, mean, model, dof (student-t). The horizon and days-per-year do not apply (a one-day backtest); a horizon
// other than one day is noted in the warnings.
//
// Errors: Assumption (field "window", "confidence", "lambda", "dof", "model"), InsufficientData (field
// "window" when no day is left to test; "holdings" when there are none), Reference (a holding
// whose asset the history lacks), Numerical (a non-finite figure), Cancelled (stop requested).
// Long runs take a std::stop_token (checked every day) and a progress callback (fraction done in
// [0, 1], called at most about a hundred times, from the calling thread).
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/coveragetests.h"
#include "tailwise/date.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"
#include "tailwise/rollingmoments.h"
#include "tailwise/runcontrol.h"

#include <Eigen/Core>

#include <functional>
#include <stop_token>
#include <vector>

namespace tailwise {

// Everything a backtest needs, as plain values (safe to copy to a worker thread).
struct BacktestRequest {
    PriceHistory prices;
    Holdings holdings;
    Assumptions assumptions; // assumptions.window is the rolling window W and must be set
};

struct BacktestDay {
    Date date;              // the day t tested
    double pnl = 0.0;       // realised P&L, money, gains positive
    double var = 0.0;       // forecast one-day VaR, money, positive = loss
    bool exception = false; // −pnl > var
};

struct BacktestResult {
    Assumptions assumptions;
    int window = 0;                 // W
    double tailProbability = 0.0;   // p = 1 − C
    std::vector<BacktestDay> days;  // one per tested day, oldest first
    int observations = 0;           // T_obs = days.size()
    int exceptions = 0;             // x
    double expectedExceptions = 0.0; // p · T_obs
    LikelihoodRatio kupiec;          // LR_pof, χ²(1)
    ChristoffersenResult christoffersen;
    ZoneResult zone;
    int normalFallbackDays = 0;      // days the model could not be fitted and the normal was used
    Warnings warnings;
};

using ProgressCallback = std::function<void(double fraction)>;

Result<BacktestResult> runBacktest(const BacktestRequest &request, std::stop_token stop = {},
                                   const ProgressCallback &progress = {});
// The same, steered like the other long computations (runcontrol.h; `threads` is not used: one
// backtest runs on the calling thread — run several models on several threads to compare them).
Result<BacktestResult> runBacktest(const BacktestRequest &request, const RunControl &control);

// The models runBacktest() accepts, in the order a comparison shows them.
std::vector<RiskModel> backtestModels();

// The tests' verdicts at a test size (e.g. 0.05): a test rejects when its p-value is below it.
struct BacktestVerdict {
    double testSize = 0.05;
    bool kupiecRejected = false;
    bool tooManyExceptions = false;   // x > expected (meaningful when kupiecRejected)
    bool independenceRejected = false;
    bool clustering = false;          // π1 > π0: an exception makes the next more likely
    bool coverageRejected = false;    // conditional coverage, χ²(2)
    bool passed = false;              // no test rejects (the zone is reported apart)
};
// Precondition: 0 < testSize < 1.
BacktestVerdict verdictAt(const BacktestResult &result, double testSize);

// Statistics of a given series of days (exceptions already decided): fills observations,
// exceptions, expectedExceptions, kupiec, christoffersen and zone. Precondition: days not empty.
void fillStatistics(BacktestResult &result);

// What a model sees on day t to forecast its VaR.
struct ForecastInput {
    const Eigen::VectorXd &exposures; // e_t, money, in holdings order
    const RollingMoments &moments;    // the window's estimates; moments.windowReturns() the returns
    const Assumptions &assumptions;   // confidence, dof, …
};

struct Forecast {
    double var = 0.0;            // one-day VaR, money, positive = loss
    bool normalFallback = false; // the model could not be fitted that day and the normal was used
};

// Ok when the backtest can run `model`; otherwise an Error (field "model") naming the model and
// the ones it can run.
Status checkBacktestModel(RiskModel model);
// One-day VaR (money, positive = loss) of the exposures under `model`. The one place a model
// plugs into the backtest.
Result<Forecast> forecastOneDayVar(RiskModel model, const ForecastInput &input);

// Dates of the exceptions, oldest first.
std::vector<Date> exceptionDates(const BacktestResult &result);

} // namespace tailwise
