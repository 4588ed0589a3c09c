#!/usr/bin/env python3
"""Generates the invented sample fund: samples/prices.csv and samples/holdings.csv.

Everything here is made up: the fund ("Larchmere Balanced Fund"), its assets and their prices.
Prices follow a seeded one-factor model with sector factors, Student-t shocks (fat tails) and a
slowly varying volatility regime, so that the models and backtests have something to tell apart.
Standard library only, so that it runs anywhere: python3 samples/generate_sample.py
"""
import datetime
import math
import random

SEED = 20261201
DAYS = 780  # about three years of trading days

# name, sector, start price, annual drift, annual idiosyncratic vol, market beta
ASSETS = [
    ("LARK_ENERGY", "energy", 48.20, 0.05, 0.22, 1.1),
    ("FENWAY_RAIL", "industry", 112.50, 0.06, 0.18, 0.9),
    ("ORRIN_BANK", "finance", 31.75, 0.07, 0.20, 1.3),
    ("HALCYON_PHARMA", "health", 86.10, 0.05, 0.19, 0.6),
    ("BRISK_FOODS", "staples", 54.40, 0.04, 0.12, 0.5),
    ("CINDER_MINING", "materials", 22.90, 0.03, 0.30, 1.4),
    ("QUAYSIDE_REIT", "property", 18.65, 0.03, 0.16, 0.8),
    ("TALLIS_SOFTWARE", "technology", 143.00, 0.10, 0.28, 1.3),
    ("MERIDIAN_TELECOM", "telecom", 12.35, 0.02, 0.14, 0.6),
    ("WOLDS_UTILITIES", "utilities", 27.80, 0.03, 0.11, 0.4),
    ("ASHGROVE_BOND_FUND", "bonds", 101.20, 0.02, 0.045, -0.1),
    ("HAVEN_GOLD_TRUST", "gold", 64.00, 0.03, 0.15, -0.2),
    ("BROAD_MARKET_FUTURE", "index", 2450.0, 0.06, 0.02, 1.0),
]

# asset, quantity (negative = short: the index future hedges part of the equity exposure)
HOLDINGS = [
    ("LARK_ENERGY", 9000), ("FENWAY_RAIL", 3500), ("ORRIN_BANK", 14000), ("HALCYON_PHARMA", 5200),
    ("BRISK_FOODS", 7000), ("CINDER_MINING", 12000), ("QUAYSIDE_REIT", 16000), ("TALLIS_SOFTWARE", 2600),
    ("MERIDIAN_TELECOM", 20000), ("WOLDS_UTILITIES", 9000), ("ASHGROVE_BOND_FUND", 12500),
    ("HAVEN_GOLD_TRUST", 4500), ("BROAD_MARKET_FUTURE", -120),
]


def student_t(rng, dof):
    """A unit-variance Student-t draw: normal / sqrt(chi2/dof), scaled by sqrt((dof-2)/dof)."""
    z = rng.gauss(0.0, 1.0)
    chi2 = sum(rng.gauss(0.0, 1.0) ** 2 for _ in range(dof))
    return z / math.sqrt(chi2 / dof) * math.sqrt((dof - 2) / dof)


def trading_days(end, count):
    days = []
    d = end
    while len(days) < count:
        if d.weekday() < 5:
            days.append(d)
        d -= datetime.timedelta(days=1)
    return list(reversed(days))


def main():
    rng = random.Random(SEED)
    dates = trading_days(datetime.date(2026, 11, 27), DAYS)
    sectors = sorted({a[1] for a in ASSETS})
    prices = [[a[2] for a in ASSETS]]
    vol_regime = 1.0
    for _ in range(DAYS - 1):
        # Volatility regime: a mean-reverting log process, so calm and stressed spells alternate.
        vol_regime = math.exp(0.97 * math.log(vol_regime) + 0.12 * rng.gauss(0.0, 1.0))
        market = 0.16 / math.sqrt(252) * vol_regime * student_t(rng, 5)
        sector_shock = {s: 0.08 / math.sqrt(252) * vol_regime * rng.gauss(0.0, 1.0) for s in sectors}
        row = []
        for (name, sector, _, drift, vol, beta), last in zip(ASSETS, prices[-1]):
            own = vol / math.sqrt(252) * vol_regime * student_t(rng, 6)
            r = drift / 252 + beta * market + sector_shock[sector] + own
            row.append(round(last * math.exp(r), 4))
        prices.append(row)
    with open("prices.csv", "w", newline="\n") as f:
        f.write("date," + ",".join(a[0] for a in ASSETS) + "\n")
        for d, row in zip(dates, prices):
            f.write(d.isoformat() + "," + ",".join(f"{p:.4f}".rstrip("0").rstrip(".") for p in row) + "\n")
    with open("holdings.csv", "w", newline="\n") as f:
        f.write("asset,quantity\n")
        for name, qty in HOLDINGS:
            f.write(f"{name},{qty}\n")


if __name__ == "__main__":
    import os
    os.chdir(os.path.dirname(os.path.abspath(__file__)))
    main()
