#!/usr/bin/python3
"""Reference figures on real market data for test_realdata (and the CLI tests).

Reads tests/data/eu-stock-indices-1991-1998.csv and the eu-holdings-*.csv portfolios beside it,
and computes, with NumPy and SciPy only, the normal VaR/ES figures defined in issue 2 for a grid of
assumptions. Written from those definitions, not from the C++ code:

  returns   simple r_t = P_t/P_{t-1} - 1, or log r_t = ln(P_t/P_{t-1}); window = N newest returns
  mean      zero, or the sample mean over the window
  cov       sample: divide by n-1, demeaned (numpy.cov, ddof=1)
            EWMA:   sum_{k=0}^{n-1} (1-l) l^k r_{T-k} r_{T-k}^T / (1-l^n), zero-mean, r_T newest
  exposure  e_i = quantity_i * (price override or last close), or the given value; V = sum e_i
  horizon   sigma_h = sqrt(H) sqrt(e' S e), mu_h = H sum e_i mu_i
  VaR, ES   z = norm.ppf(C); VaR = z sigma_h - mu_h; ES = sigma_h norm.pdf(z)/(1-C) - mu_h
  Euler     marginal_i = z sqrt(H) (S e)_i / sqrt(e' S e) - H mu_i; component_i = e_i marginal_i
            (ES: norm.pdf(z)/(1-C) in place of z)
  standalone_i = z sqrt(H) sqrt(S_ii) |e_i| - H mu_i e_i; undiversified VaR = sum standalone_i

Run with Debian's interpreter (python3-numpy, python3-scipy):
    /usr/bin/python3 tests/core/make_realdata_fixture.py
It rewrites tests/data/eu-realdata-fixture.json; the versions used are recorded in the file.
"""

import csv
import json
import os
import platform
import sys

import numpy as np
import scipy
from scipy.stats import norm

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.normpath(os.path.join(HERE, "..", "data"))
PRICES = "eu-stock-indices-1991-1998.csv"
PORTFOLIOS = {
    "long": "eu-holdings-long.csv",      # long only, quantities
    "short": "eu-holdings-short.csv",    # a short position and a price override
    "value": "eu-holdings-value.csv",    # money values, three assets in a different order
    "single": "eu-holdings-single.csv",  # one asset
}
WINDOWS = [None, 500, 250, 60]                                  # None = every return
ESTIMATORS = [("sample", None), ("ewma", 0.94), ("ewma", 0.97)]
RETURNS = ["simple", "log"]
MEANS = ["zero", "sample"]
# (horizon, confidence) pairs; each configuration gets two, so that every horizon meets every
# confidence across the grid while the fixture stays small.
HC = [(1, 0.95), (1, 0.99), (10, 0.95), (10, 0.99)]


def read_prices(path):
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.reader(f))
    assets = rows[0][1:]
    prices = np.array([[float(x) for x in row[1:]] for row in rows[1:] if row], dtype=float)
    return assets, prices


def read_holdings(path):
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.DictReader(f))
    out = []
    for row in rows:
        h = {"asset": row["asset"]}
        if "value" in row:
            h["value"] = float(row["value"])
        else:
            h["quantity"] = float(row["quantity"])
            if row.get("price"):
                h["price"] = float(row["price"])
        out.append(h)
    return out


def ewma_cov(r, lam):
    n = r.shape[0]
    k = np.arange(n - 1, -1, -1, dtype=float)          # age of row t: k = n-1-t
    w = (1.0 - lam) * lam ** k / (1.0 - lam ** n)
    cov = np.zeros((r.shape[1], r.shape[1]))
    for t in range(n):
        cov += w[t] * np.outer(r[t], r[t])
    return cov


def figures(assets, prices, holdings, window, estimator, lam, returns, mean, horizon, confidence):
    idx = [assets.index(h["asset"]) for h in holdings]
    p = prices[:, idx]
    r = p[1:] / p[:-1] - 1.0 if returns == "simple" else np.log(p[1:] / p[:-1])
    if window is not None:
        r = r[-window:]
    mu = r.mean(axis=0) if mean == "sample" else np.zeros(r.shape[1])
    if estimator == "sample":
        cov = np.atleast_2d(np.cov(r, rowvar=False, ddof=1))
    else:
        cov = ewma_cov(r, lam)
    np.linalg.cholesky(cov)  # the reference assumes no repair was needed
    last = p[-1]
    e = np.array([h["value"] if "value" in h else h["quantity"] * h.get("price", last[i])
                  for i, h in enumerate(holdings)])
    H = float(horizon)
    s1 = np.sqrt(e @ cov @ e)
    sigma_h = np.sqrt(H) * s1
    mu_h = H * (e @ mu)
    z = norm.ppf(confidence)
    tail = norm.pdf(z) / (1.0 - confidence)
    var = z * sigma_h - mu_h
    es = tail * sigma_h - mu_h
    marginal = z * np.sqrt(H) * (cov @ e) / s1 - H * mu
    marginal_es = tail * np.sqrt(H) * (cov @ e) / s1 - H * mu
    standalone = z * np.sqrt(H) * np.sqrt(np.diag(cov)) * np.abs(e) - H * mu * e
    return {
        "portfolio_value": float(e.sum()),
        "exposures": [float(x) for x in e],
        "horizon_sd_money": float(sigma_h),
        "horizon_mean_money": float(mu_h),
        "var": float(var),
        "es": float(es),
        "marginal_var": [float(x) for x in marginal],
        "component_var": [float(x) for x in e * marginal],
        "component_es": [float(x) for x in e * marginal_es],
        "standalone_var": [float(x) for x in standalone],
        "undiversified_var": float(standalone.sum()),
        "window_returns": int(r.shape[0]),
    }


def main():
    assets, prices = read_prices(os.path.join(DATA, PRICES))
    cases = []
    config = 0
    for name, file in PORTFOLIOS.items():
        holdings = read_holdings(os.path.join(DATA, file))
        for window in WINDOWS:
            for estimator, lam in ESTIMATORS:
                for returns in RETURNS:
                    for mean in MEANS:
                        for pick in (config % 4, (config + 2) % 4):
                            horizon, confidence = HC[pick]
                            case = {
                                "portfolio": name, "holdings_file": file,
                                "window": window if window is not None else "all",
                                "estimator": estimator, "lambda": lam if lam is not None else 0.94,
                                "returns": returns, "mean": mean,
                                "horizon": horizon, "confidence": confidence,
                            }
                            case.update(figures(assets, prices, holdings, window, estimator,
                                                lam if lam is not None else 0.94, returns, mean,
                                                horizon, confidence))
                            cases.append(case)
                        config += 1
    header = {
        "description": "Normal VaR/ES reference figures on the EU stock index data, from NumPy/SciPy "
                       "(tests/core/make_realdata_fixture.py); see tests/data/README.md",
        "prices_file": PRICES,
        "assets": assets,
        "generated_with": {"python": platform.python_version(), "numpy": np.__version__,
                           "scipy": scipy.__version__},
        "case_count": len(cases),
    }
    out = os.path.join(DATA, "eu-realdata-fixture.json")
    with open(out, "w", encoding="utf-8") as f:
        text = json.dumps(header, indent=1)[:-2]  # reopen the object to append the cases
        f.write(text + ',\n "cases": [\n')
        f.write(",\n".join("  " + json.dumps(c) for c in cases))
        f.write("\n ]\n}\n")
    json.load(open(out, encoding="utf-8"))  # the file must parse
    print(f"wrote {len(cases)} cases to {out}", file=sys.stderr)


if __name__ == "__main__":
    main()
