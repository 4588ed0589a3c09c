// The numbers behind the model-comparison chart, built from core compareModels rows
// (comparison.h) without drawing anything.
//
// One group per model, in core's order (normal, student-t, cornish-fisher, historical,
// monte-carlo): a bar for VaR and a bar for ES, both money over the same horizon and at the same
// confidence, as core computed them. A model that gave no figure keeps its place with its reason
// in `note` and no bars, so the picture never suggests a zero. The model of the workbook's
// assumptions is marked `current`. The y range starts at zero and leaves room for the labels.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/comparison.h"

#include <QString>

#include <optional>
#include <vector>

namespace tailwise::ui {

struct ModelComparisonGroup {
    QString model;                       // as the comparison table names it, "(as …)" after a fallback
    tailwise::RiskModel asked = tailwise::RiskModel::Normal;
    bool hasFigures = false;
    double var = 0.0, es = 0.0;          // money
    std::optional<double> varFraction, esFraction; // of portfolio value; absent when V ≤ 0
    bool current = false;                // the model the workbook's figures use
    QString note;                        // why there is no figure, or the Monte Carlo standard error
};

struct ModelComparisonChartData {
    std::vector<ModelComparisonGroup> groups;
    int horizonDays = 1;
    double confidence = 0.99;
    double yMax = 1.0;                   // money, above the tallest bar with room for its label
    QString varLegend, esLegend, yLabel, title;
    QString note;                        // shown when no model gave a figure
};

ModelComparisonChartData buildModelComparisonChartData(const std::vector<tailwise::ModelRow> &rows,
                                                       double portfolioValue,
                                                       const tailwise::Assumptions &assumptions,
                                                       const QString &currency = {}); // empty: "money"

} // namespace tailwise::ui
