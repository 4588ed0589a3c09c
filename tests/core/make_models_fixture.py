#!/usr/bin/python3
"""Reference figures of the historical, Cornish-Fisher and Student-t models on real data, for
test_models. Reads tests/data/eu-stock-indices-1991-1998.csv and computes, with NumPy and SciPy
only, from the definitions of the models (not from the C++ code):

  returns     simple r_t = P_t/P_{t-1} - 1; window = the N newest returns (or all)
  P&L         p_t = sum_i e_i r_{i,t} with the money exposures e below; losses L_t = -p_t
  historical  VaR_1 = numpy.quantile(L, C, method="linear")  (Hyndman-Fan type 7)
              ES_1  = mean of L[L >= VaR_1]
              sqrt: VaR_H = sqrt(H) VaR_1 (same for ES); overlapping: the same on -sums of H
              consecutive p_t
  shape       S = scipy.stats.skew(p), K = scipy.stats.kurtosis(p) (bias=True: divide by n)
  t fit       nu = 4 + 6/K
  C-F         z = norm.ppf(1-C); z_cf = z + (z^2-1)S/6 + (z^3-3z)K/24 - (2z^3-5z)S^2/36;
              VaR = -z_cf sigma_h (zero mean), sigma_h = sqrt(H) sqrt(e' Cov e), Cov = numpy.cov
              ES = -(1/alpha) * scipy.integrate.quad(z_cf(z) * norm.pdf(z), -inf, z) * sigma_h
  worst days  the five lowest p_t over the whole history (numpy.argsort, stable), with the date
              of the day the return ends on

Run with Debian's interpreter (python3-numpy, python3-scipy):
    /usr/bin/python3 tests/core/make_models_fixture.py
It rewrites tests/data/eu-models-fixture.json; the library versions used are recorded in it.
"""

import csv
import json
import os
import platform

import numpy as np
import scipy
from scipy import integrate, stats

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "data")

# Money exposures, in the order of the file's columns (DAX, SMI, CAC, FTSE): arbitrary test
# portfolios, one long only and one long/short.
PORTFOLIOS = {
    "long": [400000.0, 250000.0, 200000.0, 150000.0],
    "long-short": [500000.0, -300000.0, 150000.0, -100000.0],
}
WINDOWS = [None, 500]
CONFIDENCES = [0.95, 0.975, 0.99]
HORIZONS = [1, 10]


def read_prices():
    with open(os.path.join(DATA, "eu-stock-indices-1991-1998.csv"), newline="") as f:
        rows = list(csv.reader(f))
    assets = rows[0][1:]
    prices = np.array([[float(x) for x in r[1:]] for r in rows[1:] if r])
    return assets, prices


def cf_z(z, s, k):
    return z + (z * z - 1) * s / 6 + (z ** 3 - 3 * z) * k / 24 - (2 * z ** 3 - 5 * z) * s * s / 36


def main():
    assets, prices = read_prices()
    with open(os.path.join(DATA, "eu-stock-indices-1991-1998.csv"), newline="") as f:
        dates = [r[0] for r in list(csv.reader(f))[1:] if r]
    returns = prices[1:] / prices[:-1] - 1.0
    cases = []
    for pname, exposures in PORTFOLIOS.items():
        e = np.array(exposures)
        for window in WINDOWS:
            r = returns if window is None else returns[-window:]
            pnl = r @ e
            losses = -pnl
            cov = np.cov(r, rowvar=False, ddof=1)
            sd1 = float(np.sqrt(e @ cov @ e))
            s = float(stats.skew(pnl))
            k = float(stats.kurtosis(pnl))
            for c in CONFIDENCES:
                alpha = 1.0 - c
                var1 = float(np.quantile(losses, c, method="linear"))
                es1 = float(np.mean(losses[losses >= var1]))
                z = float(stats.norm.ppf(alpha))
                tail = integrate.quad(lambda x: cf_z(x, s, k) * stats.norm.pdf(x), -np.inf, z,
                                      epsabs=0, epsrel=1e-13, limit=200)[0]
                for h in HORIZONS:
                    sums = np.array([pnl[i:i + h].sum() for i in range(len(pnl) - h + 1)])
                    ol = -sums
                    var_ol = float(np.quantile(ol, c, method="linear"))
                    es_ol = float(np.mean(ol[ol >= var_ol]))
                    sdh = np.sqrt(h) * sd1
                    cases.append({
                        "portfolio": pname, "exposures": exposures,
                        "window": "all" if window is None else window,
                        "confidence": c, "horizon": h,
                        "historical_sqrt_var": float(np.sqrt(h) * var1),
                        "historical_sqrt_es": float(np.sqrt(h) * es1),
                        "historical_overlapping_var": var_ol,
                        "historical_overlapping_es": es_ol,
                        "scenarios_overlapping": int(len(ol)),
                        "skewness": s, "excess_kurtosis": k,
                        "student_t_fit_dof": 4.0 + 6.0 / k if k > 0 else None,
                        "cornish_fisher_var": float(-cf_z(z, s, k) * sdh),
                        "cornish_fisher_es": float(-tail / alpha * sdh),
                    })
    worst = []
    for pname, exposures in PORTFOLIOS.items():
        pnl = (prices[1:] / prices[:-1] - 1.0) @ np.array(exposures)
        order = np.argsort(pnl, kind="stable")[:5]
        worst.append({"portfolio": pname, "exposures": exposures,
                      "days": [{"date": dates[i + 1], "pnl": float(pnl[i])} for i in order]})
    out = {
        "description": "Historical, Cornish-Fisher and Student-t fit reference figures on the EU stock "
                       "index data, zero mean, simple returns, sample covariance "
                       "(tests/core/make_models_fixture.py)",
        "prices_file": "eu-stock-indices-1991-1998.csv",
        "assets": assets,
        "generated_with": {"python": platform.python_version(), "numpy": np.__version__,
                           "scipy": scipy.__version__},
        "cases": cases,
        "worst_days": worst,
    }
    with open(os.path.join(DATA, "eu-models-fixture.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
