#!/usr/bin/python3
"""Reference allocations of VaR and ES under every model on real data, for test_allocation.
Reads tests/data/eu-stock-indices-1991-1998.csv and computes, with NumPy and SciPy only, from the
published definitions (not from the C++ code):

  returns      simple r_t = P_t/P_{t-1} - 1; window = the 500 newest returns
  P&L          p_t = sum_i e_i r_{i,t} with money exposures e; losses L_t = -p_t
  covariance   Cov = numpy.cov (divisor n-1); mean mu = 0 ("zero") or the sample mean ("sample")
  Cornish-Fisher, after Boudt, Peterson & Croux (2008), "Estimation and decomposition of downside
               risk for portfolios with non-normal returns", Journal of Risk 11(2), with the
               co-moment matrices formed explicitly (divisor n):
                 M2 = X'X/n, M3 = X'(X kron X)/n (N x N^2), M4 = X'(X kron X kron X)/n (N x N^3)
                 of the centred window X; m2 = e'M2 e, m3 = e'M3(e kron e), m4 = e'M4(e kron e kron e)
                 S = m3/m2^1.5, K = m4/m2^2 - 3,
                 dS = 3 M3(e kron e)/m2^1.5 - 1.5 m3 2 M2 e / m2^2.5
                 dK = 4 M4(e kron e kron e)/m2^2 - 2 m4 2 M2 e / m2^3
               VaR = f_V sigma_h - H mu'e with f_V = -z_cf(a), a = norm.ppf(1-C),
               sigma_h = sqrt(H) sqrt(e'Cov e); component
                 c_i = e_i [f_V sqrt(H) (Cov e)_i/sigma_p + sigma_h (df_V/dS dS_i + df_V/dK dK_i) - H mu_i]
               ES = f_E sigma_h - H mu'e with f_E = -(1/alpha) quad(z_cf(z) phi(z), -inf, a), its
               components by differentiating that integral in S and K (the integrand is
               polynomial in S, K: the partials are quad() of the partials of z_cf).
               Standalone: the same formulas on e_i r_i alone (own S, K; sigma = sd_i |e_i|).
               aggregate scaling: S/sqrt(H), K/H and their derivatives alike.
  Student-t    factor k = t.ppf(C, nu) sqrt((nu-2)/nu), ES factor sqrt((nu-2)/nu)(nu+q^2)/(nu-1)
               t.pdf(q)/(1-C); nu = 4 + 6/K of the portfolio P&L (scipy.stats.kurtosis);
               aggregate: nu_H = 4 + 6/(K/H). Components e_i (Cov e)_i/sigma_p k sqrt(H) - H mu_i e_i.
  historical   scenario matrix P = R diag(e) (sqrt) or the sums of H consecutive rows of it
               (overlapping); L = -P.sum(axis=1); VaR = numpy.quantile(L, C, method="linear");
               ES = mean(L[L >= VaR]); component ES_i = mean(-P[L >= VaR, i]);
               kernel: b = 1.06 std(L, ddof=1) n^(-1/5), w = norm.pdf((L - VaR)/b),
               component VaR_i = VaR sum(w (-P_i)) / sum(w L) (Gourieroux, Laurent & Scaillet 2000;
               Epperlein & Smillie 2006); standalone: quantile and tail mean of -P_i; sqrt scaling
               multiplies everything by sqrt(H).

Run with Debian's interpreter (python3-numpy, python3-scipy):
    /usr/bin/python3 tests/core/make_allocation_fixture.py
It rewrites tests/data/eu-allocation-fixture.json; the library versions used are recorded in it.
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

PORTFOLIOS = {
    "long": [400000.0, 250000.0, 200000.0, 150000.0],
    "long-short": [500000.0, -300000.0, 150000.0, -100000.0],
}
WINDOW = 500


def read_prices():
    with open(os.path.join(DATA, "eu-stock-indices-1991-1998.csv"), newline="") as f:
        rows = list(csv.reader(f))
    return rows[0][1:], np.array([[float(x) for x in r[1:]] for r in rows[1:] if r])


def cf_z(z, s, k):
    return z + (z * z - 1) * s / 6 + (z ** 3 - 3 * z) * k / 24 - (2 * z ** 3 - 5 * z) * s * s / 36


def cf_factors(c, s, k):
    """f_V, f_E and their partials in S and K."""
    alpha = 1 - c
    a = stats.norm.ppf(alpha)
    fv = -cf_z(a, s, k)
    fv_s = -((a * a - 1) / 6 - (2 * a ** 3 - 5 * a) * s / 18)
    fv_k = -(a ** 3 - 3 * a) / 24
    tail = lambda g: integrate.quad(lambda z: g(z) * stats.norm.pdf(z), -np.inf, a, epsabs=0, epsrel=1e-13, limit=200)[0]
    fe = -tail(lambda z: cf_z(z, s, k)) / alpha
    fe_s = -tail(lambda z: (z * z - 1) / 6 - (2 * z ** 3 - 5 * z) * s / 18) / alpha
    fe_k = -tail(lambda z: (z ** 3 - 3 * z) / 24) / alpha
    return fv, fv_s, fv_k, fe, fe_s, fe_k


def comoments(x):
    n = x.shape[0]
    m2 = x.T @ x / n
    xx = np.einsum("ti,tj->tij", x, x).reshape(n, -1)
    m3 = x.T @ xx / n
    xxx = np.einsum("ti,tj,tk->tijk", x, x, x).reshape(n, -1)
    m4 = x.T @ xxx / n
    return m2, m3, m4


def cornish_fisher(r, e, mu, h, c, scaling):
    x = r - r.mean(axis=0)
    M2, M3, M4 = comoments(x)
    ee = np.kron(e, e)
    eee = np.kron(ee, e)
    m2 = e @ M2 @ e
    m3 = e @ M3 @ ee
    m4 = e @ M4 @ eee
    s = m3 / m2 ** 1.5
    k = m4 / m2 ** 2 - 3
    dm2 = 2 * M2 @ e
    ds = 3 * M3 @ ee / m2 ** 1.5 - 1.5 * m3 * dm2 / m2 ** 2.5
    dk = 4 * M4 @ eee / m2 ** 2 - 2 * m4 * dm2 / m2 ** 3
    if scaling == "aggregate":
        s, k, ds, dk = s / np.sqrt(h), k / h, ds / np.sqrt(h), dk / h
    cov = np.cov(r, rowvar=False)
    sigma_p = np.sqrt(e @ cov @ e)
    sigma_h = np.sqrt(h) * sigma_p
    fv, fv_s, fv_k, fe, fe_s, fe_k = cf_factors(c, s, k)
    direction = cov @ e / sigma_p
    drift = h * mu * e
    cvar = e * (fv * np.sqrt(h) * direction + sigma_h * (fv_s * ds + fv_k * dk)) - drift
    ces = e * (fe * np.sqrt(h) * direction + sigma_h * (fe_s * ds + fe_k * dk)) - drift
    sd = np.sqrt(np.diag(cov))
    svar, ses = [], []
    for i in range(len(e)):
        own = e[i] * r[:, i]
        si, ki = stats.skew(own), stats.kurtosis(own)
        if scaling == "aggregate":
            si, ki = si / np.sqrt(h), ki / h
        f = cf_factors(c, si, ki)
        spread = np.sqrt(h) * sd[i] * abs(e[i])
        svar.append(f[0] * spread - drift[i])
        ses.append(f[3] * spread - drift[i])
    var = fv * sigma_h - h * mu @ e
    es = fe * sigma_h - h * mu @ e
    return dict(var=var, es=es, skewness=s, kurtosis=k, component_var=list(cvar), component_es=list(ces),
                standalone_var=svar, standalone_es=ses)


def t_factors(nu, c):
    q = stats.t.ppf(c, nu)
    sc = np.sqrt((nu - 2) / nu)
    return sc * q, sc * (nu + q * q) / (nu - 1) * stats.t.pdf(q, nu) / (1 - c)


def student_t(r, e, mu, h, c, scaling):
    p = r @ e
    k = stats.kurtosis(p)
    nu = 4 + 6 / k
    nu_h = 4 + 6 / (k / h) if scaling == "aggregate" else nu
    kv, ke = t_factors(nu_h, c)
    cov = np.cov(r, rowvar=False)
    sigma_p = np.sqrt(e @ cov @ e)
    direction = cov @ e / sigma_p
    drift = h * mu * e
    sd = np.sqrt(np.diag(cov))
    return dict(var=kv * np.sqrt(h) * sigma_p - h * mu @ e, es=ke * np.sqrt(h) * sigma_p - h * mu @ e, dof=nu,
                horizon_dof=nu_h,
                component_var=list(e * direction * kv * np.sqrt(h) - drift),
                component_es=list(e * direction * ke * np.sqrt(h) - drift),
                standalone_var=list(kv * np.sqrt(h) * sd * abs(e) - drift),
                standalone_es=list(ke * np.sqrt(h) * sd * abs(e) - drift))


def historical(r, e, h, c, method):
    daily = r * e
    if method == "overlapping" and h > 1:
        p = np.array([daily[k:k + h].sum(axis=0) for k in range(daily.shape[0] - h + 1)])
        scale = 1.0
    else:
        p = daily
        scale = np.sqrt(h)
    loss = -p.sum(axis=1)
    var = np.quantile(loss, c, method="linear")
    tail = loss >= var
    es = loss[tail].mean()
    ces = (-p[tail]).mean(axis=0)
    b = 1.06 * np.std(loss, ddof=1) * len(loss) ** (-0.2)
    w = stats.norm.pdf((loss - var) / b)
    cvar = var * (w @ -p) / (w @ loss)
    svar = [np.quantile(-p[:, i], c, method="linear") for i in range(p.shape[1])]
    ses = [(-p[:, i])[-p[:, i] >= svar[i]].mean() for i in range(p.shape[1])]
    return dict(var=var * scale, es=es * scale, bandwidth=b, component_var=list(cvar * scale),
                component_es=list(ces * scale), standalone_var=list(np.array(svar) * scale),
                standalone_es=list(np.array(ses) * scale))


def main():
    assets, prices = read_prices()
    returns = prices[1:] / prices[:-1] - 1.0
    r = returns[-WINDOW:]
    cases = []
    for name, exposures in PORTFOLIOS.items():
        e = np.array(exposures)
        for mean in ["zero", "sample"]:
            mu = np.zeros(len(e)) if mean == "zero" else r.mean(axis=0)
            for h in [1, 10]:
                for c in [0.975, 0.99]:
                    for scaling in ["sqrt", "aggregate"]:
                        if h == 1 and scaling == "aggregate":
                            continue
                        base = dict(portfolio=name, exposures=exposures, mean=mean, horizon=h, confidence=c,
                                    scaling=scaling)
                        cases.append(dict(base, model="cornish-fisher", **cornish_fisher(r, e, mu, h, c, scaling)))
                        cases.append(dict(base, model="student-t", **student_t(r, e, mu, h, c, scaling)))
                    if mean == "zero":
                        for method in ["sqrt", "overlapping"]:
                            if h == 1 and method == "overlapping":
                                continue
                            cases.append(dict(portfolio=name, exposures=exposures, mean=mean, horizon=h, confidence=c,
                                              model="historical", hs_horizon=method,
                                              **historical(r, e, h, c, method)))
    out = dict(source="tests/core/make_allocation_fixture.py", data="eu-stock-indices-1991-1998.csv",
               window=WINDOW, numpy=np.__version__, scipy=scipy.__version__, python=platform.python_version(),
               cases=[{k: (float(v) if isinstance(v, (np.floating,)) else
                           [float(x) for x in v] if isinstance(v, list) else v) for k, v in c.items()} for c in cases])
    with open(os.path.join(DATA, "eu-allocation-fixture.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")
    print(len(cases), "cases")


if __name__ == "__main__":
    main()
