#include "tailwise/estest.h"

#include "tailwise/cornishfisher.h"
#include "tailwise/simulate.h"
#include "tailwise/studentt.h"

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include <cassert>
#include <cmath>
#include <random>

namespace tailwise {

double acerbiSzekelyZ2(std::span<const EsTestDay> days, double confidence)
{
    assert(!days.empty());
    const double alpha = 1.0 - confidence;
    double sum = 0.0;
    for (const auto &d : days)
        if (d.loss > d.var)
            sum += d.loss / d.es;
    return 1.0 - sum / (static_cast<double>(days.size()) * alpha);
}

Result<EsTestResult> esTest(std::span<const EsTestDay> days, std::span<const LossDistribution> models,
                            double confidence, int simulations, std::uint64_t seed)
{
    if (days.empty() || days.size() != models.size())
        return fieldError(ErrorKind::Assumption, "es-test", "the ES test needs one model distribution for each tested day");
    if (simulations < 100)
        return fieldError(ErrorKind::Assumption, "es-test",
                          "expected at least 100 simulations for the ES test's p-value, found " + std::to_string(simulations));
    for (std::size_t t = 0; t < days.size(); ++t)
        if (!(days[t].es > 0.0) || !std::isfinite(days[t].es))
            return fieldError(ErrorKind::Assumption, "es-test",
                              "the ES forecast of tested day " + std::to_string(t + 1)
                                  + " is not positive: the Acerbi-Szekely statistic divides by it");
    EsTestResult out;
    out.z2 = acerbiSzekelyZ2(days, confidence);
    out.simulations = simulations;
    out.seed = seed;
    const double alpha = 1.0 - confidence;
    const double scale = 1.0 / (static_cast<double>(days.size()) * alpha);
    const boost::math::normal standard;
    // t distributions are built once per distinct ν (a day's fit repeats across days).
    double lastNu = -1.0;
    std::optional<boost::math::students_t> t;
    int atOrBelow = 0;
    for (int m = 0; m < simulations; ++m) {
        std::mt19937_64 engine(blockSeed(seed, static_cast<std::uint64_t>(m)));
        double sum = 0.0;
        for (std::size_t d = 0; d < days.size(); ++d) {
            const LossDistribution &model = models[d];
            double u = 0.0;
            do
                u = static_cast<double>(engine() >> 11) * 0x1.0p-53;
            while (u <= 0.0);
            double loss = 0.0;
            switch (model.kind) {
            case LossDistribution::Kind::Empirical: {
                const std::size_t n = model.losses.size();
                const auto k = std::min(n - 1, static_cast<std::size_t>(u * static_cast<double>(n)));
                loss = model.losses[k];
                break;
            }
            case LossDistribution::Kind::Normal:
                if (u <= confidence)
                    continue;
                loss = -model.mean + model.sd * boost::math::quantile(standard, u);
                break;
            case LossDistribution::Kind::StudentT:
                if (u <= confidence)
                    continue;
                if (model.dof != lastNu) {
                    t.emplace(model.dof);
                    lastNu = model.dof;
                }
                loss = -model.mean + model.sd * studentTScale(model.dof) * boost::math::quantile(*t, u);
                break;
            case LossDistribution::Kind::CornishFisher:
                if (u <= confidence)
                    continue;
                loss = -model.mean - model.sd * cornishFisherZ(boost::math::quantile(standard, 1.0 - u), model.shape);
                break;
            }
            if (loss > days[d].var)
                sum += loss / days[d].es;
        }
        if (1.0 - sum * scale <= out.z2)
            ++atOrBelow;
    }
    out.pValue = static_cast<double>(atOrBelow) / static_cast<double>(simulations);
    out.rejected = out.pValue < 0.05;
    out.verdict = out.rejected ? "rejected at the 5% test size: the losses beyond VaR were larger than the ES forecasts said"
                               : "not rejected at the 5% test size: the losses beyond VaR are consistent with the ES forecasts";
    return out;
}

} // namespace tailwise
