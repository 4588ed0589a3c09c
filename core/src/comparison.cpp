#include "tailwise/comparison.h"

#include <algorithm>

namespace tailwise {

Result<std::vector<ModelRow>> compareModels(const PriceHistory &prices, const Holdings &holdings,
                                            const Assumptions &assumptions, const RunControl &control)
{
    const RiskModel order[] = {RiskModel::Normal, RiskModel::StudentT, RiskModel::CornishFisher, RiskModel::Historical,
                               RiskModel::MonteCarlo};
    Assumptions normal = assumptions;
    normal.model = RiskModel::Normal;
    auto base = computeRisk(prices, holdings, normal);
    if (!base)
        return base.error();
    const Warnings &shared = base.value().warnings;

    std::vector<ModelRow> rows;
    for (RiskModel model : order) {
        if (control.stop.stop_requested())
            return fieldError(ErrorKind::Cancelled, "model", "the model comparison was cancelled");
        Assumptions a = assumptions;
        a.model = model;
        // Monte Carlo is the long row: it reports its own progress into the last 80% of the bar.
        RunControl inner;
        inner.stop = control.stop;
        inner.threads = control.threads;
        if (control.progress && model == RiskModel::MonteCarlo)
            inner.progress = [&](double f) { control.progress(0.2 + 0.8 * f); };
        auto r = model == RiskModel::Normal ? base : computeRisk(prices, holdings, a, inner);
        ModelRow row;
        row.model = model;
        if (!r) {
            if (r.error().kind == ErrorKind::Cancelled)
                return r.error();
            row.error = r.error().message;
        } else {
            row.used = r.value().model.used;
            row.figures = r.value().figures;
            row.varStandardError = r.value().model.varStandardError;
            for (const auto &w : r.value().warnings)
                if (std::find(shared.begin(), shared.end(), w) == shared.end())
                    row.warnings.push_back(w);
        }
        rows.push_back(std::move(row));
        if (control.progress && model != RiskModel::MonteCarlo)
            control.progress(0.05 * static_cast<double>(rows.size()));
    }
    if (control.progress)
        control.progress(1.0);
    return rows;
}

} // namespace tailwise
