// The numbers behind the contributions view, built from a core RiskReport.
//
// Each bar is a holding's component VaR (Euler allocation, core contributions.h): they sum to
// the portfolio VaR. A negative component is a hedge: adding to that holding lowers VaR. Bars are
// sorted from the largest risk to the strongest hedge. Beyond `maxBars` holdings the smallest
// contributions (by size) are pooled into one "other holdings" bar, so a 500-line portfolio
// stays readable; the pool keeps the sum of its members.
// The diversification side shows the undiversified VaR (sum of standalone VaRs), the portfolio
// VaR and the benefit between them, all as core computed them.
#pragma once

#include "tailwise/risk.h"

#include <QString>

#include <optional>
#include <vector>

namespace tailwise::ui {

struct ContributionsOptions {
    int maxBars = 20;
    QString currency{}; // the workbook's code, named on the money axes; empty: "money"
};

struct ContributionBar {
    QString asset;
    double componentVar = 0.0;              // money
    std::optional<double> share;            // of portfolio VaR
    bool hedge = false;                     // componentVar < 0
    int pooled = 0;                         // > 0 for the "other holdings" bar: how many it holds
};

struct ContributionsChartData {
    std::vector<ContributionBar> bars;      // sorted by componentVar, largest first; the pooled bar (if any) last
    double portfolioVar = 0.0;
    double undiversifiedVar = 0.0;
    double diversificationBenefit = 0.0;
    bool hasHedges = false;
    QString valueLabel;                     // axis label, with the horizon and confidence
    QString stepLabel;                      // the step chart's money axis label
    QString benefitText;                    // the annotation, broken into short lines
};

ContributionsChartData buildContributionsChartData(const RiskReport &report, const ContributionsOptions &options = {});

} // namespace tailwise::ui
