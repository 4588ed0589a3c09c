#include "tailwise/coveragetests.h"

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>

#include <algorithm>
#include <cassert>
#include <cmath>

namespace tailwise {

namespace {

// count · ln(probability) with 0·ln 0 = 0. A positive count always comes with a positive
// probability here, since every probability is estimated from the same counts or given in (0, 1).
double countLog(double count, double probability)
{
    if (count == 0.0)
        return 0.0;
    return count * std::log(probability);
}

// count · ln(1 − probability), through log1p for accuracy when the probability is small.
double countLog1m(double count, double probability)
{
    if (count == 0.0)
        return 0.0;
    return count * std::log1p(-probability);
}

LikelihoodRatio fromStatistic(double lr, double degreesOfFreedom)
{
    // Rounding can leave a statistic a hair below zero when the fit is perfect.
    lr = std::max(0.0, lr);
    const boost::math::chi_squared chi2(degreesOfFreedom);
    return LikelihoodRatio{lr, boost::math::cdf(boost::math::complement(chi2, lr))};
}

double kupiecStatistic(int exceptions, int observations, double p)
{
    const double x = exceptions;
    const double t = observations;
    const double pHat = x / t;
    const double null = countLog1m(t - x, p) + countLog(x, p);
    const double fitted = countLog1m(t - x, pHat) + countLog(x, pHat);
    return -2.0 * null + 2.0 * fitted;
}

double ratio(int numerator, int denominator)
{
    return denominator == 0 ? 0.0 : static_cast<double>(numerator) / static_cast<double>(denominator);
}

} // namespace

LikelihoodRatio kupiecPof(int exceptions, int observations, double tailProbability)
{
    assert(observations >= 1 && exceptions >= 0 && exceptions <= observations);
    assert(tailProbability > 0.0 && tailProbability < 1.0);
    return fromStatistic(kupiecStatistic(exceptions, observations, tailProbability), 1.0);
}

TransitionCounts countTransitions(std::span<const bool> hits)
{
    TransitionCounts c;
    for (std::size_t t = 1; t < hits.size(); ++t) {
        const bool before = hits[t - 1];
        const bool now = hits[t];
        if (!before)
            (now ? c.n01 : c.n00) += 1;
        else
            (now ? c.n11 : c.n10) += 1;
    }
    return c;
}

ChristoffersenResult christoffersen(std::span<const bool> hits, double tailProbability)
{
    assert(!hits.empty());
    assert(tailProbability > 0.0 && tailProbability < 1.0);
    ChristoffersenResult r;
    const TransitionCounts c = countTransitions(hits);
    r.transitions = c;
    r.pi0 = ratio(c.n01, c.n00 + c.n01);
    r.pi1 = ratio(c.n11, c.n10 + c.n11);
    r.pi = ratio(c.n01 + c.n11, c.total());

    const double restricted = countLog1m(c.n00 + c.n10, r.pi) + countLog(c.n01 + c.n11, r.pi);
    const double unrestricted = countLog1m(c.n00, r.pi0) + countLog(c.n01, r.pi0) + countLog1m(c.n10, r.pi1)
                                + countLog(c.n11, r.pi1);
    const double lrInd = c.total() == 0 ? 0.0 : -2.0 * restricted + 2.0 * unrestricted;
    r.independence = fromStatistic(lrInd, 1.0);

    const int days = static_cast<int>(hits.size());
    const int exceptions = static_cast<int>(std::count(hits.begin(), hits.end(), true));
    r.pof = kupiecPof(exceptions, days, tailProbability);
    r.conditionalCoverage = fromStatistic(r.pof.lr + r.independence.lr, 2.0);

    if (c.total() > 0) {
        r.pofConditioned = kupiecPof(c.n01 + c.n11, c.total(), tailProbability);
        r.conditionalCoverageConditioned = fromStatistic(r.pofConditioned.lr + r.independence.lr, 2.0);
    } else {
        r.pofConditioned = LikelihoodRatio{};
        r.conditionalCoverageConditioned = fromStatistic(0.0, 2.0);
    }
    return r;
}

ZoneResult trafficLightZone(int exceptions, int observations, double tailProbability)
{
    assert(observations >= 1 && exceptions >= 0 && exceptions <= observations);
    assert(tailProbability > 0.0 && tailProbability < 1.0);
    const boost::math::binomial binomial(static_cast<double>(observations), tailProbability);
    ZoneResult z;
    z.cumulativeProbability = boost::math::cdf(binomial, static_cast<double>(exceptions));
    z.upperTail = boost::math::cdf(boost::math::complement(binomial, static_cast<double>(exceptions)));
    // F ≥ 0.95 ⟺ P(X > x) ≤ 0.05, and F ≥ 0.9999 ⟺ P(X > x) ≤ 0.0001 (see the header).
    if (exceptions == 0)
        z.zone = Zone::Green; // none is never evidence of too many (see the header)
    else if (z.upperTail <= 1.0 - zoneRedFrom)
        z.zone = Zone::Red;
    else if (z.upperTail <= 1.0 - zoneYellowFrom)
        z.zone = Zone::Yellow;
    else
        z.zone = Zone::Green;
    return z;
}

std::string_view toName(Zone zone)
{
    switch (zone) {
    case Zone::Green: return "green";
    case Zone::Yellow: return "yellow";
    case Zone::Red: return "red";
    }
    return "green";
}

} // namespace tailwise
