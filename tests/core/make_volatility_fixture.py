#!/usr/bin/python3
"""Fixture for tests/core/test_volatility_core.cpp: filtered historical simulation (EWMA filter),
GARCH(1,1) log-likelihood maxima, FZ0 scores and the Diebold-Mariano test, computed with NumPy and
SciPy from the definitions in core/include/tailwise/filteredhistorical.h, garch.h and ranking.h.

Data: tests/data/eu-stock-indices-1991-1998.csv (real data; provenance in tests/data/README.md).
Run with Debian's interpreter (python3-numpy, python3-scipy):

    /usr/bin/python3 tests/core/make_volatility_fixture.py > tests/data/volatility-eu-fixture.json
"""
import csv
import warnings
import json
import math
import os

import numpy as np
import scipy
from scipy import optimize, stats

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "data", "eu-stock-indices-1991-1998.csv")


def read_prices():
    with open(DATA, newline="") as f:
        rows = list(csv.reader(f))
    assets = rows[0][1:]
    prices = np.array([[float(x) for x in r[1:]] for r in rows[1:]])
    return assets, prices


def ewma_filter(r, lam):
    """sigma2_1 = mean(r^2); sigma2_t = lam sigma2_{t-1} + (1-lam) r_{t-1}^2; forecast sigma2_{T+1}."""
    T = len(r)
    s2 = np.empty(T)
    s2[0] = np.mean(r * r)
    for t in range(1, T):
        s2[t] = lam * s2[t - 1] + (1 - lam) * r[t - 1] ** 2
    nxt = lam * s2[-1] + (1 - lam) * r[-1] ** 2
    return s2, nxt


def fhs_ewma(R, e, conf, lam, horizon):
    scen = np.empty_like(R)
    for i in range(R.shape[1]):
        s2, nxt = ewma_filter(R[:, i], lam)
        scen[:, i] = R[:, i] * math.sqrt(nxt) / np.sqrt(s2)
    losses = -(scen @ e)
    var = np.quantile(losses, conf, method="linear")
    es = losses[losses >= var].mean()
    root = math.sqrt(horizon)
    return var * root, es * root


def garch_loglik(params, r):
    omega, alpha, beta = params
    T = len(r)
    s2 = np.empty(T)
    s2[0] = np.mean(r * r)
    for t in range(1, T):
        s2[t] = omega + alpha * r[t - 1] ** 2 + beta * s2[t - 1]
    if np.any(s2 <= 0):
        return -np.inf
    return -0.5 * np.sum(np.log(2 * np.pi) + np.log(s2) + r * r / s2)


def garch_scipy_best(r):
    """The largest log-likelihood SciPy's optimisers find from several starts, under
    omega > 0, alpha, beta >= 0, alpha + beta < 1 (SLSQP with the inequality, and L-BFGS-B /
    Nelder-Mead on a bounded reparametrisation)."""
    m = np.mean(r * r)
    scale = m  # omega in units of the mean square keeps the problem well conditioned
    best = -np.inf
    best_params = None
    starts = [(0.05, 0.90), (0.10, 0.85), (0.02, 0.97), (0.20, 0.70), (0.08, 0.91)]

    def neg(x):
        v = garch_loglik((x[0] * scale, x[1], x[2]), r)
        return 1e10 if not np.isfinite(v) else -v

    for a, b in starts:
        x0 = np.array([(1 - a - b), a, b])
        cons = [{"type": "ineq", "fun": lambda x: 1 - 1e-8 - x[1] - x[2]}]
        bounds = [(1e-10, None), (0.0, 1.0), (0.0, 1.0)]
        for method in ("SLSQP", "trust-constr"):
            try:
                if method == "SLSQP":
                    res = optimize.minimize(neg, x0, method="SLSQP", bounds=bounds, constraints=cons,
                                            options={"ftol": 1e-14, "maxiter": 2000})
                else:
                    lin = optimize.LinearConstraint([[0, 1, 1]], -np.inf, 1 - 1e-8)
                    res = optimize.minimize(neg, x0, method="trust-constr", bounds=optimize.Bounds([1e-10, 0, 0], [np.inf, 1, 1]),
                                            constraints=[lin], options={"xtol": 1e-12, "gtol": 1e-10, "maxiter": 5000})
            except Exception:
                continue
            x = res.x
            if x[0] > 0 and x[1] >= 0 and x[2] >= 0 and x[1] + x[2] < 1:
                v = garch_loglik((x[0] * scale, x[1], x[2]), r)
                if v > best:
                    best = v
                    best_params = (x[0] * scale, x[1], x[2])
    return best, best_params


def newey_west_lag(T):
    lag = 0
    while (lag + 1) ** 3 <= T:
        lag += 1
    return lag


def fz0(L, v, e, alpha):
    return np.where(L >= v, (L - v) / (alpha * e), 0.0) + v / e + np.log(e) - 1.0


def diebold_mariano(d):
    T = len(d)
    L = newey_west_lag(T)
    dm = d - d.mean()
    V = np.dot(dm, dm) / T
    for l in range(1, L + 1):
        V += 2 * (1 - l / (L + 1)) * np.dot(dm[l:], dm[:-l]) / T
    stat = d.mean() / math.sqrt(V / T)
    return stat, 2 * stats.norm.sf(abs(stat)), L


def main():
    warnings.filterwarnings("ignore")
    assets, prices = read_prices()
    returns = prices[1:] / prices[:-1] - 1.0
    out = {"generator": "tests/core/make_volatility_fixture.py",
           "numpy": np.__version__, "scipy": scipy.__version__, "fhs": [], "garch": [], "ranking": {}}

    books = {
        "long": {"DAX": 120, "SMI": 150, "CAC": 180, "FTSE": 110},
        "long-short": {"DAX": 50, "CAC": -40, "FTSE": 70},
    }
    for name, window, conf, lam, horizon, book in [
        ("long-500-99", 500, 0.99, 0.94, 1, "long"),
        ("long-all-99-h10", None, 0.99, 0.94, 10, "long"),
        ("long-short-250-975", 250, 0.975, 0.97, 1, "long-short"),
    ]:
        held = books[book]
        cols = [assets.index(a) for a in held]
        e = np.array([held[a] * prices[-1, assets.index(a)] for a in held])
        R = returns[:, cols] if window is None else returns[-window:, cols]
        var, es = fhs_ewma(R, e, conf, lam, horizon)
        out["fhs"].append({"name": name, "holdings": [[a, held[a]] for a in held], "window": window,
                           "confidence": conf, "lambda": lam, "horizon": horizon, "var": var, "es": es})

    for asset in assets:
        for window in (None, 500):
            r = returns[:, assets.index(asset)]
            if window is not None:
                r = r[-window:]
            best, params = garch_scipy_best(r)
            out["garch"].append({"asset": asset, "window": window, "scipy_best_loglik": best,
                                 "scipy_params": list(params)})

    # FZ0 and Diebold-Mariano on seeded invented forecasts: three models over 400 days.
    rng = np.random.default_rng(20261202)
    T = 400
    alpha = 0.025
    sd = 1000 * np.exp(0.3 * np.cumsum(rng.normal(0, 0.1, T)))
    losses = sd * rng.standard_t(5, T) * math.sqrt(3 / 5)
    z = stats.norm.ppf(1 - alpha)
    models = []
    for name, factor in (("good", 1.0), ("low", 0.7), ("high", 1.4)):
        v = factor * sd * z
        e = factor * sd * stats.norm.pdf(z) / alpha
        models.append({"model": name, "var": list(v), "es": list(e)})
    scores = [fz0(losses, np.array(m["var"]), np.array(m["es"]), alpha) for m in models]
    means = [s.mean() for s in scores]
    best = int(np.argmin(means))
    rows = []
    for k, m in enumerate(models):
        if k == best:
            rows.append({"model": m["model"], "fz0": means[k], "dm_statistic": 0.0, "dm_p_value": 1.0})
        else:
            stat, p, lag = diebold_mariano(scores[k] - scores[best])
            rows.append({"model": m["model"], "fz0": means[k], "dm_statistic": stat, "dm_p_value": p, "lag": lag})
    out["ranking"] = {"confidence": 1 - alpha, "losses": list(losses), "models": models, "rows": rows,
                      "first_scores": [list(s[:5]) for s in scores]}
    print(json.dumps(out, indent=1))


if __name__ == "__main__":
    main()
