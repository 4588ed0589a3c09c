// The model, what-if and stress parts of the `var` report, as JSON members and as readable text.
#pragma once

#include "varextras.h"

#include "tailwise/json.h"
#include "tailwise/risk.h"

#include <string>

namespace tailwise::cli {

// Members inside the "assumptions" object: the model's own parameters.
void writeModelAssumptionsJson(JsonWriter &json, const Assumptions &assumptions);
// Top-level members: model_used, contributions_model, model_details, standard_error (Monte Carlo).
void writeModelJson(JsonWriter &json, const RiskReport &report);
// Top-level members what_if and stress, when present.
void writeExtrasJson(JsonWriter &json, const ReportExtras &extras);

// Lines for the readable report.
std::string modelText(const RiskReport &report);
std::string extrasText(const ReportExtras &extras);
// The cautions sentence about the model's own limits.
std::string modelCaution(RiskModel model);

} // namespace tailwise::cli
