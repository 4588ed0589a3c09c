#!/usr/bin/python3
"""Backtest fixture for tests/core/test_backtest.cpp, computed with NumPy/SciPy from the definition
in core/include/tailwise/backtest.h, refitting every window from scratch (no incremental update).

Data: tests/data/eu-stock-indices-1991-1998.csv (real data; provenance in tests/data/README.md).
Run with Debian's interpreter (python3-numpy, python3-scipy):

    /usr/bin/python3 tests/core/make_backtest_fixture.py > tests/data/backtest-eu-fixture.json

Definition followed, for each day t = W+1 .. T:
  e_t = quantity * P_{t-1} (or the money value, constant), window r_{t-W} .. r_{t-1} (simple or
  log returns as the case says), sample covariance (ddof = 1) or finite-window EWMA
  (1-lam) lam^k / (1 - lam^W), mean zero or the window's sample mean,
  VaR_t = z sqrt(e' S e) - e' mu with z = norm.ppf(C) (normal), or the Student-t, Cornish-Fisher
  and historical forms of backtest.h on the window's P&L p = R e; P&L_t = e_t . r_t with simple returns;
  exception when -P&L_t > VaR_t. Then Kupiec (1995) LR_pof, Christoffersen (1998) LR_ind and
  LR_cc = LR_pof + LR_ind, p-values from chi2.sf, and the zone from binom.cdf / binom.sf
  (green below 95 %, yellow below 99.99 %, red from there; Basel Committee 1996).
"""
import csv
import json
import math
import os
import sys

import mpmath
import numpy as np
import scipy
from scipy import stats

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "data", "eu-stock-indices-1991-1998.csv")

CASES = [
    {"name": "quantities-sample-99", "holdings": [["DAX", "quantity", 100], ["SMI", "quantity", 80],
                                                   ["CAC", "quantity", 120], ["FTSE", "quantity", 60]],
     "window": 250, "confidence": 0.99, "returns": "simple", "estimator": "sample", "lambda": 0.94, "mean": "zero"},
    {"name": "quantities-ewma-99", "holdings": [["DAX", "quantity", 100], ["SMI", "quantity", 80],
                                                 ["CAC", "quantity", 120], ["FTSE", "quantity", 60]],
     "window": 250, "confidence": 0.99, "returns": "simple", "estimator": "ewma", "lambda": 0.94, "mean": "zero"},
    {"name": "long-short-log-95", "holdings": [["DAX", "quantity", 50], ["CAC", "quantity", -40],
                                                ["FTSE", "quantity", 70]],
     "window": 100, "confidence": 0.95, "returns": "log", "estimator": "sample", "lambda": 0.94, "mean": "sample"},
    {"name": "values-ewma-975", "holdings": [["DAX", "value", 1000000], ["SMI", "value", 500000],
                                              ["FTSE", "value", -300000]],
     "window": 500, "confidence": 0.975, "returns": "simple", "estimator": "ewma", "lambda": 0.97, "mean": "sample"},
    {"name": "short-window-99", "holdings": [["SMI", "quantity", 10], ["CAC", "quantity", 10]],
     "window": 20, "confidence": 0.99, "returns": "simple", "estimator": "sample", "lambda": 0.94, "mean": "zero"},
    {"name": "student-t-fit-99", "model": "student-t", "dof": "fit",
     "holdings": [["DAX", "quantity", 100], ["SMI", "quantity", 80], ["CAC", "quantity", 120], ["FTSE", "quantity", 60]],
     "window": 250, "confidence": 0.99, "returns": "simple", "estimator": "sample", "lambda": 0.94, "mean": "zero"},
    {"name": "student-t-5-975", "model": "student-t", "dof": 5,
     "holdings": [["DAX", "value", 1000000], ["SMI", "value", 500000], ["FTSE", "value", -300000]],
     "window": 500, "confidence": 0.975, "returns": "simple", "estimator": "ewma", "lambda": 0.94, "mean": "sample"},
    {"name": "cornish-fisher-99", "model": "cornish-fisher",
     "holdings": [["DAX", "quantity", 100], ["SMI", "quantity", 80], ["CAC", "quantity", 120], ["FTSE", "quantity", 60]],
     "window": 250, "confidence": 0.99, "returns": "simple", "estimator": "ewma", "lambda": 0.97, "mean": "zero"},
    {"name": "historical-99", "model": "historical",
     "holdings": [["DAX", "quantity", 50], ["CAC", "quantity", -40], ["FTSE", "quantity", 70]],
     "window": 500, "confidence": 0.99, "returns": "simple", "estimator": "sample", "lambda": 0.94, "mean": "sample"},
    {"name": "historical-log-95", "model": "historical",
     "holdings": [["DAX", "quantity", 100], ["SMI", "quantity", 80], ["CAC", "quantity", 120], ["FTSE", "quantity", 60]],
     "window": 100, "confidence": 0.95, "returns": "log", "estimator": "sample", "lambda": 0.94, "mean": "zero"},
]
# Cases without "model" use the normal model.

# Every SAMPLE_EVERY-th tested day keeps its P&L and VaR in the fixture (all exceptions are listed).
SAMPLE_EVERY = 25


def read_prices():
    with open(DATA, newline="") as f:
        rows = list(csv.reader(f))
    assets = rows[0][1:]
    dates = [r[0] for r in rows[1:]]
    prices = np.array([[float(x) for x in r[1:]] for r in rows[1:]])
    return assets, dates, prices


def xlogy(count, prob):
    return 0.0 if count == 0 else count * math.log(prob)


def kupiec(x, t, p):
    phat = x / t
    lr = -2.0 * (xlogy(t - x, 1 - p) + xlogy(x, p)) + 2.0 * (xlogy(t - x, 1 - phat) + xlogy(x, phat))
    return max(lr, 0.0)


def christoffersen(hits):
    prev, now = hits[:-1], hits[1:]
    n00 = int(np.sum((prev == 0) & (now == 0)))
    n01 = int(np.sum((prev == 0) & (now == 1)))
    n10 = int(np.sum((prev == 1) & (now == 0)))
    n11 = int(np.sum((prev == 1) & (now == 1)))
    pi0 = n01 / (n00 + n01) if n00 + n01 else 0.0
    pi1 = n11 / (n10 + n11) if n10 + n11 else 0.0
    pi = (n01 + n11) / (n00 + n01 + n10 + n11)
    lr = -2.0 * (xlogy(n00 + n10, 1 - pi) + xlogy(n01 + n11, pi)) \
        + 2.0 * (xlogy(n00, 1 - pi0) + xlogy(n01, pi0) + xlogy(n10, 1 - pi1) + xlogy(n11, pi1))
    return max(lr, 0.0), [n00, n01, n10, n11]


def t_quantile(c, nu):
    """Student-t quantile to full double precision. SciPy 1.10's t.ppf (special.stdtrit) is off by
    about 1e-9 relative at some non-integer nu (e.g. 2.968223896266 against 2.968223893088 at
    nu = 7.2605, C = 0.99), too coarse for a 1e-9 comparison, so the quantile is solved with mpmath
    at 40 digits from the regularised incomplete beta form of the t CDF, starting from SciPy's."""
    mpmath.mp.dps = 40
    n = mpmath.mpf(nu)

    def cdf(x):
        return 1 - mpmath.betainc(n / 2, mpmath.mpf(1) / 2, 0, n / (n + x * x), regularized=True) / 2

    start = mpmath.mpf(float(stats.t.ppf(c, nu)))
    return float(mpmath.findroot(lambda x: cdf(x) - mpmath.mpf(c), start))


def forecast(case, window, cov, mu, e, c, z):
    """One-day VaR of exposures e from one window, and whether the normal was used instead."""
    model = case.get("model", "normal")
    sd = math.sqrt(max(float(e @ cov @ e), 0.0))
    mean = float(e @ mu)
    normal = z * sd - mean
    pnl = window @ e                     # the window's daily P&L at today's exposures
    if model == "historical":
        return float(np.quantile(-pnl, c, method="linear")), 0   # Hyndman-Fan type 7
    if model == "normal":
        return normal, 0
    if np.var(pnl) == 0.0:
        return normal, 1
    skew = float(stats.skew(pnl, bias=True))
    kurt = float(stats.kurtosis(pnl, fisher=True, bias=True))
    if model == "student-t":
        if case["dof"] == "fit":
            if not kurt > 0.0:
                return normal, 1
            nu = 4.0 + 6.0 / kurt
        else:
            nu = float(case["dof"])
        factor = math.sqrt((nu - 2.0) / nu) * t_quantile(c, nu)
        return factor * sd - mean, 0
    if model == "cornish-fisher":
        q = stats.norm.ppf(1.0 - c)
        zcf = q + (q * q - 1) * skew / 6 + (q ** 3 - 3 * q) * kurt / 24 - (2 * q ** 3 - 5 * q) * skew ** 2 / 36
        return -zcf * sd - mean, 0
    raise ValueError(model)


def run(case, assets, dates, prices):
    cols = [assets.index(h[0]) for h in case["holdings"]]
    p = prices[:, cols]
    simple = p[1:] / p[:-1] - 1.0
    est = np.log(p[1:] / p[:-1]) if case["returns"] == "log" else simple
    w = case["window"]
    c = case["confidence"]
    lam = case["lambda"]
    z = stats.norm.ppf(c)
    by_value = np.array([h[1] == "value" for h in case["holdings"]])
    amount = np.array([float(h[2]) for h in case["holdings"]])
    n_returns = simple.shape[0]
    days = []
    fallbacks = 0
    for row in range(w, n_returns):          # return row `row` belongs to date row+1
        window = est[row - w:row]
        if case["estimator"] == "ewma":
            k = np.arange(w - 1, -1, -1, dtype=float)   # age of each row, oldest first
            weights = (1 - lam) * lam ** k / (1 - lam ** w)
            cov = (window * weights[:, None]).T @ window
        else:
            cov = np.cov(window, rowvar=False, ddof=1)
        mu = window.mean(axis=0) if case["mean"] == "sample" else np.zeros(window.shape[1])
        e = np.where(by_value, amount, amount * p[row])  # price row `row` is the close before the day
        var, fell_back = forecast(case, window, cov, mu, e, c, z)
        fallbacks += fell_back
        pnl = float(e @ simple[row])
        days.append((dates[row + 1], pnl, var, -pnl > var))
    hits = np.array([d[3] for d in days], dtype=int)
    t = len(days)
    x = int(hits.sum())
    tail = 1.0 - c
    lr_pof = kupiec(x, t, tail)
    lr_ind, transitions = christoffersen(hits)
    lr_cc = lr_pof + lr_ind
    cum = float(stats.binom.cdf(x, t, tail))
    upper = float(stats.binom.sf(x, t, tail))
    zone = "green" if x == 0 else "red" if upper <= 1 - 0.9999 else "yellow" if upper <= 1 - 0.95 else "green"
    margin = min(abs(-d[1] - d[2]) / max(abs(d[2]), 1e-300) for d in days)
    out = dict(case)
    out.update({
        "observations": t,
        "exceptions": x,
        "expected_exceptions": tail * t,
        "kupiec": {"lr": lr_pof, "p_value": float(stats.chi2.sf(lr_pof, 1))},
        "christoffersen": {"lr_ind": lr_ind, "p_ind": float(stats.chi2.sf(lr_ind, 1)),
                           "lr_cc": lr_cc, "p_cc": float(stats.chi2.sf(lr_cc, 2)),
                           "transitions": transitions},
        "zone": zone,
        "cumulative_probability": cum,
        "first_date": days[0][0],
        "last_date": days[-1][0],
        "exception_dates": [d[0] for d in days if d[3]],
        "smallest_relative_margin": margin,
        "normal_fallback_days": fallbacks,
        "sampled_days": [{"index": i, "date": d[0], "pnl": d[1], "var": d[2]}
                         for i, d in enumerate(days) if i % SAMPLE_EVERY == 0 or d[3]],
    })
    return out


def main():
    assets, dates, prices = read_prices()
    fixture = {
        "generator": "tests/core/make_backtest_fixture.py",
        "data": "tests/data/eu-stock-indices-1991-1998.csv",
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "mpmath": mpmath.__version__,
        "python": sys.version.split()[0],
        "cases": [run(c, assets, dates, prices) for c in CASES],
    }
    json.dump(fixture, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
