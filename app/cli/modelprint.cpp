#include "modelprint.h"

#include "numbertext.h"

#include <cstdio>

namespace tailwise::cli {

namespace {

std::string pad(const std::string &s, std::size_t width, bool right)
{
    if (s.size() >= width)
        return s;
    const std::string fill(width - s.size(), ' ');
    return right ? fill + s : s + fill;
}

std::string general(double v)
{
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.6g", v);
    return buffer;
}

// The multi-day convention in words (Student-t and Cornish-Fisher; multidayscaling.h).
std::string scalingText(const RiskReport &r)
{
    const ModelDetails &m = r.model;
    const Assumptions &a = r.assumptions;
    const std::string days = std::to_string(a.horizonDays);
    std::string out = "Longer horizons     ";
    if (a.scaling == MultiDayScaling::SquareRoot) {
        out += "square root of time: the one-day figure times the square root of the horizon, with one day's shape";
    } else if (m.used == RiskModel::StudentT) {
        out += "the model applied to the sum of the horizon's days";
        if (a.horizonDays > 1)
            out += !(*m.dof > 4.0) ? ": degrees of freedom kept at " + general(*m.dof) + " (4 or fewer; see the warnings)"
                                   : ": " + general(m.horizonDof.value_or(*m.dof)) + " degrees of freedom for the " + days
                                         + "-day sum";
    } else {
        out += "the model applied to the sum of the horizon's days";
        if (a.horizonDays > 1 && m.horizonShape)
            out += ": skewness " + general(m.horizonShape->skewness) + ", excess kurtosis "
                   + general(m.horizonShape->excessKurtosis) + " of the " + days + "-day sum";
    }
    if (a.horizonDays == 1)
        out += " (the same figure either way at one day)";
    return out + "\n";
}

} // namespace

void writeModelAssumptionsJson(JsonWriter &j, const Assumptions &a)
{
    if (a.model == RiskModel::StudentT || a.model == RiskModel::MonteCarlo) {
        j.key("dof");
        switch (a.dof.kind) {
        case DegreesOfFreedom::Kind::Given: j.value(a.dof.value); break;
        case DegreesOfFreedom::Kind::Fit: j.value("fit"); break;
        case DegreesOfFreedom::Kind::Unset:
            if (a.model == RiskModel::StudentT)
                j.value("fit");
            else
                j.null();
            break;
        }
    }
    if (a.model == RiskModel::Historical)
        j.key("hs_horizon").value(toName(a.historicalHorizon));
    if (a.model == RiskModel::StudentT || a.model == RiskModel::CornishFisher)
        j.key("scaling").value(toName(a.scaling));
    if (a.model == RiskModel::MonteCarlo) {
        j.key("simulations").value(a.simulations);
        j.key("seed").value(static_cast<double>(a.seed));
    }
}

void writeModelJson(JsonWriter &j, const RiskReport &r)
{
    const ModelDetails &m = r.model;
    j.key("model_used").value(toName(m.used));
    j.key("contributions_model").value(toName(m.contributions));
    if (m.varStandardError) {
        j.key("standard_error").value(*m.varStandardError);
        j.key("es_standard_error").value(m.esStandardError);
        j.key("standard_error_method").value(m.standardErrorMethod);
    }
    j.key("model_details").beginObject();
    if (m.dof) {
        j.key("dof").value(*m.dof);
        j.key("dof_fitted").value(m.dofFitted);
    }
    if (m.horizonDof)
        j.key("horizon_dof").value(*m.horizonDof);
    if (m.shape) {
        j.key("skewness").value(m.shape->skewness);
        j.key("excess_kurtosis").value(m.shape->excessKurtosis);
    }
    if (m.horizonShape) {
        j.key("horizon_skewness").value(m.horizonShape->skewness);
        j.key("horizon_excess_kurtosis").value(m.horizonShape->excessKurtosis);
    }
    if (m.cornishFisherMonotone)
        j.key("cornish_fisher_monotone").value(*m.cornishFisherMonotone);
    if (m.used == RiskModel::Historical)
        j.key("scenarios").value(m.scenarios);
    if (m.used == RiskModel::MonteCarlo) {
        j.key("simulations").value(m.simulations);
        j.key("seed").value(static_cast<double>(m.seed.value_or(0)));
    }
    j.endObject();
}

void writeExtrasJson(JsonWriter &j, const ReportExtras &x)
{
    if (x.whatIf) {
        const WhatIf &w = *x.whatIf;
        j.key("what_if").beginObject();
        j.key("trades").beginArray();
        for (const auto &t : x.trades) {
            j.beginObject();
            j.key("asset").value(t.asset);
            j.key("change").value(t.change);
            j.endObject();
        }
        j.endArray();
        j.key("var_before").value(w.figures.varBefore);
        j.key("var_after").value(w.figures.varAfter);
        j.key("incremental_var").value(w.figures.incrementalVar);
        j.key("marginal_estimate").value(w.figures.marginalEstimate);
        j.key("estimate_gap").value(w.figures.estimateGap);
        j.key("marginal_method").value(w.marginalMethod);
        j.key("es_before").value(w.before.figures.es);
        j.key("es_after").value(w.after.figures.es);
        j.key("holdings").beginArray();
        for (std::size_t i = 0; i < w.before.holdings.size(); ++i) {
            const auto &b = w.before.holdings[i];
            const auto &a = w.after.holdings[i];
            j.beginObject();
            j.key("asset").value(b.asset);
            j.key("exposure_before").value(b.exposure);
            j.key("exposure_after").value(a.exposure);
            j.key("component_var_before").value(b.componentVar);
            j.key("component_var_after").value(a.componentVar);
            j.endObject();
        }
        j.endArray();
        j.key("warnings").beginArray();
        for (const auto &warning : w.warnings)
            j.value(warning);
        j.endArray();
        j.endObject();
    }
    if (x.stress) {
        j.key("stress").beginArray();
        for (const auto &s : *x.stress) {
            j.beginObject();
            j.key("name").value(s.name);
            j.key("pnl").value(s.pnl);
            if (s.date)
                j.key("date").value(toIso(*s.date));
            j.endObject();
        }
        j.endArray();
    }
}

std::string modelText(const RiskReport &r)
{
    const ModelDetails &m = r.model;
    const Assumptions &a = r.assumptions;
    std::string out;
    switch (m.used) {
    case RiskModel::Normal:
        if (a.model != RiskModel::Normal)
            out += "Model               normal (the " + std::string(toName(a.model)) + " model fell back; see the warnings)\n";
        break;
    case RiskModel::StudentT:
        out += "Model               Student-t, " + general(*m.dof) + " degrees of freedom"
               + (m.dofFitted ? " (fitted from the P&L's excess kurtosis " + general(m.shape->excessKurtosis) + ")" : "")
               + ", scaled to the covariance's variance\n";
        out += scalingText(r);
        break;
    case RiskModel::CornishFisher:
        out += "Model               Cornish-Fisher, skewness " + general(m.shape->skewness) + ", excess kurtosis "
               + general(m.shape->excessKurtosis) + " of the window's daily P&L"
               + (m.cornishFisherMonotone.value_or(true) ? "" : " (expansion not monotone)") + "\n";
        out += scalingText(r);
        break;
    case RiskModel::Historical:
        out += "Model               historical, " + std::to_string(m.scenarios)
               + (a.historicalHorizon == HistoricalHorizon::Overlapping && a.horizonDays > 1
                      ? " overlapping " + std::to_string(a.horizonDays) + "-day losses"
                      : " daily losses" + std::string(a.horizonDays > 1 ? ", scaled by the square root of the horizon" : ""))
               + "\n";
        break;
    case RiskModel::MonteCarlo:
        out += "Model               Monte Carlo, " + std::to_string(m.simulations) + " draws, seed "
               + std::to_string(m.seed.value_or(0))
               + (m.dof ? ", Student-t scenarios with " + general(*m.dof) + " degrees of freedom" : ", normal scenarios")
               + "\n";
        out += "Standard error      VaR " + money(m.varStandardError.value_or(0.0)) + ", ES "
               + money(m.esStandardError.value_or(0.0)) + " (" + m.standardErrorMethod + ")\n";
        break;
    }
    return out;
}

std::string extrasText(const ReportExtras &x)
{
    std::string out;
    if (x.whatIf) {
        const WhatIf &w = *x.whatIf;
        out += "\nWhat-if trade\n";
        for (const auto &t : x.trades)
            out += "  " + t.asset + " " + (t.change >= 0 ? "+" : "") + general(t.change) + " units\n";
        out += "  VaR before          " + pad(money(w.figures.varBefore), 16, true) + "\n";
        out += "  VaR after           " + pad(money(w.figures.varAfter), 16, true) + "\n";
        out += "  Incremental VaR     " + pad(money(w.figures.incrementalVar), 16, true) + "   (exact change)\n";
        out += "  Marginal estimate   " + pad(money(w.figures.marginalEstimate), 16, true) + "   (first order: "
               + w.marginalMethod + ")\n";
        out += "  Difference          " + pad(money(w.figures.estimateGap), 16, true)
               + "   (large when the trade is not small next to the portfolio)\n";
        for (const auto &warning : w.warnings)
            out += "  note: " + warning + "\n";
    }
    if (x.stress) {
        out += "\nStress (P&L on today's holdings; gains positive)\n";
        for (const auto &s : *x.stress)
            out += "  " + pad(s.name + (s.date ? " (" + toIso(*s.date) + ")" : ""), 34, false)
                   + pad(money(s.pnl), 16, true) + "\n";
    }
    return out;
}

std::string modelCaution(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return "The normal model understates fat tails.";
    case RiskModel::StudentT: return "The Student-t model fattens the tails but keeps them symmetric.";
    case RiskModel::CornishFisher:
        return "The Cornish-Fisher correction rests on the sample's skewness and kurtosis, which few extreme days can move.";
    case RiskModel::Historical: return "Historical figures assume the window's days are a fair sample of tomorrow; a crisis "
                                       "outside the window is not in them.";
    case RiskModel::MonteCarlo: return "Monte Carlo figures carry sampling error (see the standard error) on top of the "
                                       "model's.";
    }
    return "";
}

} // namespace tailwise::cli
