// Tests of a VaR model's exceptions: Kupiec's proportion of failures, Christoffersen's
// independence and conditional coverage, and the traffic-light zone.
//
// Input is the hit sequence I_1 … I_T (I_t = 1 when day t's loss was strictly greater than its
// VaR forecast) and the tail probability p = 1 − C of the VaR. Conventions: 0·ln 0 = 0 throughout;
// an LR statistic that rounds below zero is reported as zero; p-values come from the upper tail
// of the χ² distribution through Boost.Math's complement form, cdf(complement(χ²_k, LR)), which
// keeps small p-values accurate where 1 − cdf would lose them.
//
// Kupiec proportion of failures (Kupiec, P. 1995, "Techniques for verifying the accuracy of risk
// measurement models", Journal of Derivatives 3(2), 73–84): x exceptions in T days, p̂ = x/T,
//   LR_pof = −2 ln[(1−p)^(T−x) p^x] + 2 ln[(1−p̂)^(T−x) p̂^x]   ~ χ²(1) under H0: P(I_t = 1) = p.
//
// Christoffersen independence (Christoffersen, P. 1998, "Evaluating interval forecasts",
// International Economic Review 39(4), 841–862): n_ij = number of days t ≥ 2 with I_{t−1} = i and
// I_t = j (T − 1 transitions in all);
//   π0 = n01/(n00+n01), π1 = n11/(n10+n11), π = (n01+n11)/(n00+n01+n10+n11),
//   LR_ind = −2 ln[(1−π)^(n00+n10) π^(n01+n11)] + 2 ln[(1−π0)^n00 π0^n01 (1−π1)^n10 π1^n11] ~ χ²(1).
// A probability whose counts are all zero (e.g. π1 when no exception is followed by a day) enters
// only with zero exponents and contributes nothing.
// Conditional coverage: LR_cc = LR_pof + LR_ind ~ χ²(2), with LR_pof over all T days (common
// practice, and what reports give). Christoffersen's own form conditions on the first day, i.e.
// uses LR_pof over the T − 1 transitions (x' = n01 + n11, T' = T − 1); it is given as well.
//
// Traffic-light zone (Basel Committee on Banking Supervision 1996, "Supervisory framework for the
// use of 'backtesting' in conjunction with the internal models approach to market risk capital
// requirements", Table 2): with X ~ Binomial(T, p) and F = P(X ≤ x),
//   green when F < 0.95, yellow when 0.95 ≤ F < 0.9999, red when F ≥ 0.9999.
// For T = 250, p = 0.01 this gives the Committee's table: green 0–4, yellow 5–9, red 10 or more.
// The comparison is made on the upper tail P(X > x) = 1 − F (Boost.Math's complement form), which
// is the accurate side near 99.99%. The zones speak of too many exceptions, so x = 0 is green even
// on so few days that (1−p)^T ≥ 95% (T ≤ 5 at p = 0.01), where the rule alone would say yellow.
//
// Preconditions (asserted, programmer errors): 0 < p < 1, 0 ≤ x ≤ T, T ≥ 1.
#pragma once

#include <array>
#include <span>
#include <string_view>

namespace tailwise {

struct LikelihoodRatio {
    double lr = 0.0;     // the statistic, ≥ 0
    double pValue = 1.0; // P(χ²_k ≥ lr), in [0, 1]
};

// Kupiec's LR_pof for x exceptions in T days at tail probability p.
LikelihoodRatio kupiecPof(int exceptions, int observations, double tailProbability);

struct TransitionCounts {
    int n00 = 0, n01 = 0, n10 = 0, n11 = 0;
    int total() const { return n00 + n01 + n10 + n11; }
};

// Counts the day-to-day transitions of a hit sequence (T − 1 of them for T days).
TransitionCounts countTransitions(std::span<const bool> hits);

struct ChristoffersenResult {
    TransitionCounts transitions;
    double pi0 = 0.0, pi1 = 0.0, pi = 0.0; // 0 where the denominator is zero
    LikelihoodRatio independence;          // LR_ind, χ²(1)
    LikelihoodRatio pof;                   // LR_pof over all T days, χ²(1)
    LikelihoodRatio conditionalCoverage;   // LR_pof + LR_ind, χ²(2)
    // Christoffersen's form conditioned on the first day: LR_pof over the T − 1 transitions.
    LikelihoodRatio pofConditioned;
    LikelihoodRatio conditionalCoverageConditioned;
};

// Precondition: hits.size() ≥ 1. With a single day there are no transitions: LR_ind = 0.
ChristoffersenResult christoffersen(std::span<const bool> hits, double tailProbability);

enum class Zone { Green, Yellow, Red };

struct ZoneResult {
    Zone zone = Zone::Green;
    double cumulativeProbability = 0.0; // F = P(X ≤ x), X ~ Binomial(T, p)
    double upperTail = 1.0;             // P(X > x) = 1 − F, computed directly
};

ZoneResult trafficLightZone(int exceptions, int observations, double tailProbability);

// "green", "yellow", "red": the names used in JSON.
std::string_view toName(Zone zone);

// The zone thresholds on F: yellow from 95%, red from 99.99% (Basel Committee 1996).
inline constexpr double zoneYellowFrom = 0.95;
inline constexpr double zoneRedFrom = 0.9999;

} // namespace tailwise
