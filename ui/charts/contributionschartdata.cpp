#include "charts/contributionschartdata.h"

#include "charts/chartstyle.h"
#include "text/names.h"

#include <QCoreApplication>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {
QString tr(const char *text, int n = -1) { return QCoreApplication::translate("ContributionsChart", text, nullptr, n); }
double finiteOr0(double v) { return std::isfinite(v) ? v : 0.0; }
QString modelAdjective(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return tr("normal");
    case RiskModel::StudentT: return tr("Student-t");
    case RiskModel::CornishFisher: return tr("Cornish–Fisher");
    case RiskModel::Historical: return tr("historical");
    case RiskModel::MonteCarlo: return tr("Monte Carlo");
    }
    return tr("normal");
}
} // namespace

ContributionsChartData buildContributionsChartData(const RiskReport &report, const ContributionsOptions &options)
{
    ContributionsChartData d;
    d.portfolioVar = finiteOr0(report.figures.var);
    d.undiversifiedVar = finiteOr0(report.undiversifiedVar);
    d.diversificationBenefit = finiteOr0(report.diversificationBenefit);

    std::vector<ContributionBar> all;
    all.reserve(report.holdings.size());
    for (const HoldingRisk &h : report.holdings) {
        ContributionBar bar;
        bar.asset = shortName(QString::fromStdString(h.asset)); // an axis label: a long name is shortened
        bar.componentVar = finiteOr0(h.componentVar);
        if (h.componentShare && std::isfinite(*h.componentShare))
            bar.share = h.componentShare;
        bar.hedge = bar.componentVar < 0.0;
        all.push_back(std::move(bar));
    }
    // Keep the largest by size; pool the rest.
    const std::size_t keep = static_cast<std::size_t>(std::max(1, options.maxBars));
    if (all.size() > keep) {
        std::stable_sort(all.begin(), all.end(), [](const ContributionBar &a, const ContributionBar &b) {
            return std::abs(a.componentVar) > std::abs(b.componentVar);
        });
        ContributionBar pool;
        pool.pooled = static_cast<int>(all.size() - (keep - 1));
        for (std::size_t k = keep - 1; k < all.size(); ++k)
            pool.componentVar += all[k].componentVar;
        if (d.portfolioVar != 0.0)
            pool.share = pool.componentVar / d.portfolioVar;
        pool.hedge = pool.componentVar < 0.0;
        pool.asset = tr("%n other holdings", pool.pooled);
        all.resize(keep - 1);
        std::stable_sort(all.begin(), all.end(), [](const ContributionBar &a, const ContributionBar &b) { return a.componentVar > b.componentVar; });
        all.push_back(std::move(pool));
    } else {
        std::stable_sort(all.begin(), all.end(), [](const ContributionBar &a, const ContributionBar &b) { return a.componentVar > b.componentVar; });
    }
    d.bars = std::move(all);
    d.hasHedges = std::any_of(d.bars.cbegin(), d.bars.cend(), [](const ContributionBar &b) { return b.hedge; });

    const QString conf = chartstyle::confidenceText(report.assumptions.confidence);
    d.valueLabel = QCoreApplication::translate("ContributionsChart", "Contribution to %1 %n-day %3 VaR (%2)", nullptr,
                                               report.assumptions.horizonDays)
                       .arg(conf, chartstyle::moneyUnit(options.currency), modelAdjective(report.model.contributions));
    d.stepLabel = tr("VaR (%1)").arg(chartstyle::moneyUnit(options.currency));
    const QString share = d.undiversifiedVar != 0.0 ? chartstyle::percent(std::abs(d.diversificationBenefit) / d.undiversifiedVar, 1)
                                                    : QStringLiteral("n/a");
    d.benefitText = d.diversificationBenefit >= 0.0
                        ? tr("Diversification lowers VaR\nby %1, %2 of the\nsum of standalone VaRs")
                              .arg(chartstyle::money(d.diversificationBenefit), share)
                        : tr("VaR is not subadditive here:\ntogether %1 more, %2 of the\nsum of standalone VaRs")
                              .arg(chartstyle::money(-d.diversificationBenefit), share);
    return d;
}

} // namespace tailwise::ui
