// Student-t Value-at-Risk and Expected Shortfall, scaled to the portfolio's variance.
//
// A standard t_ν variable has variance ν/(ν−2) (ν > 2); s = √((ν−2)/ν) rescales it to unit
// variance, so the model keeps the covariance estimate and only fattens the tails. With q = t_ν⁻¹(C),
// f_ν the t density, σ_h and μ_h the horizon P&L standard deviation and mean (money, risk.h):
//   VaR = s q σ_h − μ_h
//   ES  = s (ν + q²)/(ν − 1) · f_ν(q)/(1 − C) · σ_h − μ_h
// (McNeil, Frey & Embrechts, Quantitative Risk Management (2005), ch. 2, the Student-t ES
// example (mem); the unit-variance scaling follows from the t variance.) q and f_ν come from Boost.Math,
// q through the complement form so that C near 1 keeps its accuracy.
//
// Fit by moments: a t_ν has excess kurtosis K = 6/(ν − 4) for ν > 4, so ν = 4 + 6/K from the
// moment estimate K of the window's daily portfolio P&L (shape.h). When K ≤ 0 (no fat tails in
// the sample) there is no t with that kurtosis: the fit reports nothing and the caller falls back
// to the normal model with a warning.
// Preconditions: ν > 2, 0 < C < 1.
#pragma once

#include "tailwise/parametric.h"

#include <optional>

namespace tailwise {

double studentTScale(double dof);                         // s = √((ν−2)/ν)
double studentTVarFactor(double dof, double confidence);  // s · t_ν⁻¹(C)
double studentTEsFactor(double dof, double confidence);   // s (ν+q²)/(ν−1) f_ν(q)/(1−C)
VarEs studentTVarEs(HorizonMoments horizon, double dof, double confidence);

// ν = 4 + 6/K; nullopt when K ≤ 0 or K is not finite.
std::optional<double> fitDofByKurtosis(double excessKurtosis);

} // namespace tailwise
