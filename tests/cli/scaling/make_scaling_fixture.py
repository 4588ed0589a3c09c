#!/usr/bin/python3
"""Reference figures of `tailwise-cli var --scaling sqrt|aggregate` for test_cli_scaling.
Reads tests/data/eu-stock-indices-1991-1998.csv and computes, with NumPy and SciPy only, from the
definitions (not from the C++ code):

  window       simple returns r_t = P_t/P_{t-1} - 1, the 500 newest; zero mean; money exposures e
  spread       sigma_1 = sqrt(e' Cov e), Cov = numpy.cov (divisor n - 1); sigma_H = sqrt(H) sigma_1
  shape        of the daily P&L p_t = sum_i e_i r_{i,t}: S = scipy.stats.skew(p), K =
               scipy.stats.kurtosis(p) (excess, divisor n)
  H-day shape  sqrt:      S_H = S,         K_H = K
               aggregate: S_H = S/sqrt(H), K_H = K/H  (cumulants of a sum of H independent days add,
               so the k-th standardised cumulant of the sum is H^(1-k/2) times the daily one;
               e.g. Kendall & Stuart, The Advanced Theory of Statistics, vol. 1, cumulants of sums)
  Student-t    nu = 4 + 6/K (fitted: the t's excess kurtosis 6/(nu-4) equals K) or given;
               sqrt: nu_H = nu; aggregate: nu_H solves 6/(nu_H - 4) = K_H with K_H = 6/(nu-4)/H,
               i.e. nu_H = 4 + 6/K_H; nu kept when nu <= 4 (no finite kurtosis)
               VaR = t.ppf(C, nu_H) sqrt((nu_H-2)/nu_H) sigma_H (SciPy's Student-t quantile, the t
               scaled to unit variance), ES = sqrt((nu_H-2)/nu_H) (nu_H + q^2)/(nu_H - 1) t.pdf(q)/(1-C)
               sigma_H, q = t.ppf(C, nu_H) (McNeil, Frey & Embrechts 2005, ex. 2.20)
  Cornish-Fisher  z_cf(z) = z + (z^2-1) S_H/6 + (z^3-3z) K_H/24 - (2z^3-5z) S_H^2/36 (the
               Cornish-Fisher expansion as used for VaR by Zangari (1996), "A VaR methodology for
               portfolios that include options", RiskMetrics Monitor Q1), a = norm.ppf(1-C);
               VaR = -z_cf(a) sigma_H; ES = -(1/(1-C)) quad(z_cf(z) phi(z), -inf, a) sigma_H
               (the mean of the expanded quantile over the tail)

Run with Debian's interpreter (python3-numpy, python3-scipy):
    /usr/bin/python3 tests/cli/scaling/make_scaling_fixture.py
It rewrites tests/data/eu-scaling-fixture.json; the library versions used are recorded in it.
"""

import csv
import json
import os
import platform

import numpy as np
import scipy
from scipy import integrate, stats

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "..", "data")
WINDOW = 500
PORTFOLIOS = {
    "long": {"DAX": 400000.0, "SMI": 250000.0, "CAC": 200000.0, "FTSE": 150000.0},
    "long-short": {"DAX": 500000.0, "SMI": -300000.0, "CAC": 150000.0, "FTSE": -100000.0},
}


def read_prices():
    with open(os.path.join(DATA, "eu-stock-indices-1991-1998.csv"), newline="") as f:
        rows = [r for r in csv.reader(f) if r]
    return rows[0][1:], np.array([[float(x) for x in r[1:]] for r in rows[1:]])


def horizon_shape(s, k, h, scaling):
    return (s / np.sqrt(h), k / h) if scaling == "aggregate" else (s, k)


def horizon_dof(nu, h, scaling):
    if scaling != "aggregate" or nu <= 4:
        return nu
    k_h = 6.0 / (nu - 4.0) / h
    return 4.0 + 6.0 / k_h


def student_t(nu, c, sigma_h):
    q = stats.t.ppf(c, nu)
    unit = np.sqrt((nu - 2.0) / nu)
    var = q * unit * sigma_h
    es = unit * (nu + q * q) / (nu - 1.0) * stats.t.pdf(q, nu) / (1.0 - c) * sigma_h
    return var, es


def cf_z(z, s, k):
    return z + (z * z - 1) * s / 6 + (z ** 3 - 3 * z) * k / 24 - (2 * z ** 3 - 5 * z) * s * s / 36


def cornish_fisher(s, k, c, sigma_h):
    alpha = 1.0 - c
    a = stats.norm.ppf(alpha)
    var = -cf_z(a, s, k) * sigma_h
    tail = integrate.quad(lambda z: cf_z(z, s, k) * stats.norm.pdf(z), -np.inf, a, epsabs=0, epsrel=1e-13, limit=200)[0]
    es = -tail / alpha * sigma_h
    return var, es


def main():
    assets, prices = read_prices()
    returns = (prices[1:] / prices[:-1] - 1.0)[-WINDOW:]
    cases = []
    for name, book in PORTFOLIOS.items():
        e = np.array([book.get(a, 0.0) for a in assets])
        p = returns @ e
        sigma_1 = np.sqrt(e @ np.cov(returns, rowvar=False) @ e)
        s, k = stats.skew(p), stats.kurtosis(p)
        for h in [1, 10, 20]:
            for c in [0.975, 0.99]:
                for scaling in ["sqrt", "aggregate"]:
                    sigma_h = np.sqrt(h) * sigma_1
                    base = dict(portfolio=name, horizon=h, confidence=c, scaling=scaling)
                    s_h, k_h = horizon_shape(s, k, h, scaling)
                    var, es = cornish_fisher(s_h, k_h, c, sigma_h)
                    cases.append(dict(base, model="cornish-fisher", dof=None, var=var, es=es, skewness=s,
                                      excess_kurtosis=k, horizon_skewness=s_h, horizon_excess_kurtosis=k_h))
                    for dof in [None, 8.0, 3.5]:
                        nu = 4.0 + 6.0 / k if dof is None else dof
                        nu_h = horizon_dof(nu, h, scaling)
                        var, es = student_t(nu_h, c, sigma_h)
                        cases.append(dict(base, model="student-t", dof=dof if dof is not None else "fit", var=var,
                                          es=es, nu=nu, horizon_dof=nu_h))
    out = dict(source="tests/cli/scaling/make_scaling_fixture.py", data="eu-stock-indices-1991-1998.csv",
               window=WINDOW, portfolios=PORTFOLIOS, numpy=np.__version__, scipy=scipy.__version__,
               python=platform.python_version(),
               cases=[{key: float(v) if isinstance(v, (np.floating, float)) else v for key, v in c.items()} for c in cases])
    with open(os.path.join(DATA, "eu-scaling-fixture.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")
    print(len(cases), "cases")


if __name__ == "__main__":
    main()
