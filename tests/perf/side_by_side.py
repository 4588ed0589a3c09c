#!/usr/bin/python3
"""Tailwise beside the script a practitioner would write instead (NumPy and pandas), on the same files.

    /usr/bin/python3 tests/perf/side_by_side.py [--build build] [--runs 5]
    /usr/bin/python3 tests/perf/side_by_side.py --smoke [--build build]

The full run lets build/tests/perf/bench_stages write its invented data (a 2,500-day x 1,000-asset
price CSV and two holdings files), then times each stage several times, alternating the tool and
the reference so that both see the same load on the machine, and prints the medians and the ratio
tool / reference:

  load        bench_stages (readPriceCsv, in-process)        vs  pandas.read_csv (in-process)
  covariance  bench_stages (the sample covariance)           vs  numpy.cov of the same returns
  Monte Carlo tailwise-cli var --model monte-carlo --timings  vs  Cholesky, standard normals,
              (timings_ms.simulate), 100,000 draws, 200 assets     return vectors, P&L, quantile

Both sides of the load and covariance run in a process that has done the same work before, as a
script in a notebook would; the command line's own timings_ms.load, in a fresh process that must
first fault in its memory, is printed beside them.

and the stages with a goal in absolute time (the backtest and edit -> headline, from bench_stages).
Timings depend on the machine; nothing here fails on them.

--smoke: a quick check that the tool and NumPy give the same figures on a small invented book
(normal VaR and ES to 1e-9 relative; Monte Carlo within four standard errors of the closed form).
It exits 77 (skipped) when NumPy or pandas is missing, 1 when a figure disagrees.

The reference uses Debian's python3-numpy and python3-pandas; with libopenblas-dev installed, NumPy's
BLAS is OpenBLAS (update-alternatives picks it), which the goals assume.
"""
import argparse
import json
import math
import os
import statistics
import subprocess
import sys
import tempfile
import time

SKIPPED = 77

try:
    import numpy as np
    import pandas as pd
except ImportError as missing:  # optional: the project builds and tests without them
    print(f"side_by_side: skipped, {missing.name} is not installed (Debian: python3-numpy python3-pandas)")
    sys.exit(SKIPPED)

GOALS = {"load": 0.25, "covariance": 1.0, "monte carlo": 0.25}
ABSOLUTE_GOALS_MS = {"backtest 5,000 x 100": 1000.0, "edit -> headline, 1,000 holdings": 16.0}


def tool_paths(build):
    cli = os.path.join(build, "app", "cli", "tailwise-cli")
    bench = os.path.join(build, "tests", "perf", "bench_stages")
    for path in (cli, bench):
        if not os.access(path, os.X_OK):
            sys.exit(f"side_by_side: {path} is missing: build it first (cmake --build {build})")
    return cli, bench


def run_cli(cli, args):
    out = subprocess.run([cli, "var", *args, "--json", "--timings"], check=True, capture_output=True, text=True)
    return json.loads(out.stdout)


def elapsed_ms(work):
    start = time.perf_counter()
    result = work()
    return (time.perf_counter() - start) * 1e3, result


def read_prices(path):
    return pd.read_csv(path, index_col=0)


def reference_covariance(returns):
    return np.cov(returns, rowvar=False)


def reference_monte_carlo(cov, exposures, draws, confidence, seed):
    """What a script does: Cholesky factor, standard normals, the return vectors, P&L, quantile."""
    factor = np.linalg.cholesky(cov)
    z = np.random.default_rng(seed).standard_normal((draws, cov.shape[0]))
    pnl = (z @ factor.T) @ exposures
    losses = -pnl
    var = np.quantile(losses, confidence)  # type 7, as the tool
    return var, losses[losses >= var].mean()


def normal_var_es(cov, exposures, confidence):
    sd = math.sqrt(exposures @ cov @ exposures)
    z = statistics.NormalDist().inv_cdf(confidence)
    return z * sd, sd * math.exp(-0.5 * z * z) / math.sqrt(2 * math.pi) / (1 - confidence)


def exposures_for(prices, holdings_path):
    holdings = pd.read_csv(holdings_path)
    last = prices.iloc[-1]
    return np.array([q * last[a] for a, q in zip(holdings["asset"], holdings["quantity"])]), list(holdings["asset"])


def machine():
    cpu = "unknown processor"
    try:
        with open("/proc/cpuinfo") as f:
            cpu = next(line.split(":", 1)[1].strip() for line in f if line.startswith("model name"))
    except (OSError, StopIteration):
        pass
    memory = os.sysconf("SC_PAGE_SIZE") * os.sysconf("SC_PHYS_PAGES") / 2**30
    return f"{cpu}, {os.cpu_count()} cores, {memory:.0f} GiB; NumPy {np.__version__}, pandas {pd.__version__}"


def full_run(build, runs):
    cli, bench = tool_paths(build)
    data = tempfile.mkdtemp(prefix="tailwise-side-by-side-")
    prices_path = os.path.join(data, "prices-2500x1000.csv")
    book = [os.path.join(data, "holdings-1000.csv")]
    mc = [os.path.join(data, "holdings-200.csv")]
    times = {k: ([], []) for k in ("load", "covariance", "monte carlo")}
    cli_load = []
    absolute = {k: [] for k in ABSOLUTE_GOALS_MS}
    peak = None
    # Warm-up, untimed: the first pass pays for the page cache and OpenBLAS starting its threads.
    subprocess.run([bench, "--write", data, "--repeat", "1", "--json"], check=True, capture_output=True)
    prices = read_prices(prices_path)
    returns = prices.to_numpy()[1:] / prices.to_numpy()[:-1] - 1.0
    reference_covariance(returns)
    exposures200, assets200 = exposures_for(prices, mc[0])
    cov200 = reference_covariance(returns[:, :200])
    for k in range(runs):
        stages = json.loads(subprocess.run([bench, "--write", data, "--repeat", "3", "--json"], check=True,
                                           capture_output=True, text=True).stdout)
        times["load"][0].append(stages["load_ms"])
        times["covariance"][0].append(stages["covariance_ms"])
        absolute["backtest 5,000 x 100"].append(stages["backtest_ms"])
        absolute["edit -> headline, 1,000 holdings"].append(stages["edit_ms"])
        peak = stages
        times["covariance"][1].append(elapsed_ms(lambda: reference_covariance(returns))[0])

        tool = run_cli(cli, ["--prices", prices_path, "--holdings", book[0]])
        cli_load.append(tool["timings_ms"]["load"])
        times["load"][1].append(elapsed_ms(lambda: read_prices(prices_path))[0])

        tool_mc = run_cli(cli, ["--prices", prices_path, "--holdings", mc[0], "--model", "monte-carlo",
                                "--simulations", "100000", "--seed", str(k + 1)])
        times["monte carlo"][0].append(tool_mc["timings_ms"]["simulate"])
        ms, ref_mc = elapsed_ms(lambda: reference_monte_carlo(cov200, exposures200, 100000, 0.99, k + 1))
        times["monte carlo"][1].append(ms)
        print(f"  run {k + 1}/{runs}: load {times['load'][0][-1]:.0f}/{times['load'][1][-1]:.0f} ms, "
              f"covariance {times['covariance'][0][-1]:.0f}/{times['covariance'][1][-1]:.0f} ms, "
              f"Monte Carlo {times['monte carlo'][0][-1]:.0f}/{times['monte carlo'][1][-1]:.0f} ms "
              f"(VaR {tool_mc['var']:.0f} vs {ref_mc[0]:.0f})", flush=True)

    print(f"\nTailwise vs NumPy/pandas, median of {runs} runs ({machine()})\n")
    print("| stage | Tailwise | reference | ratio | goal |")
    print("|---|---|---|---|---|")
    met = True
    for stage, (ours, theirs) in times.items():
        ratio = statistics.median(ours) / statistics.median(theirs)
        met &= ratio <= GOALS[stage]
        print(f"| {stage} | {statistics.median(ours):.0f} ms | {statistics.median(theirs):.0f} ms | {ratio:.2f} | "
              f"<= {GOALS[stage]:.2f} {'met' if ratio <= GOALS[stage] else 'NOT met'} |")
    for stage, values in absolute.items():
        value = statistics.median(values)
        met &= value <= ABSOLUTE_GOALS_MS[stage]
        print(f"| {stage} | {value:.1f} ms | | | < {ABSOLUTE_GOALS_MS[stage]:.0f} ms "
              f"{'met' if value <= ABSOLUTE_GOALS_MS[stage] else 'NOT met'} |")
    print(f"\ntailwise-cli var --timings in a fresh process: load {statistics.median(cli_load):.0f} ms (median)")
    print(f"Peak memory while reading the 2,500 x 1,000 file: {peak['load_peak_mib'] - peak['load_base_mib']:.0f} MiB "
          f"above the {peak['load_base_mib']:.0f} MiB before it (file {peak['file_mib']:.0f} MiB, prices "
          f"{peak['data_mib']:.0f} MiB)")
    print("Every goal met." if met else "Some goals are not met on this run.")
    subprocess.run(["rm", "-rf", data], check=False)


def write_small_book(folder, days=300, assets=12, seed=11):
    """An invented book: seeded one-factor random walks (nothing real)."""
    rng = np.random.default_rng(seed)
    market = rng.standard_normal(days)
    vols = 0.008 + 0.002 * np.arange(assets)
    steps = vols * (0.7 * market[:, None] + 0.7 * rng.standard_normal((days, assets)))
    prices = 50.0 * np.exp(np.cumsum(steps, axis=0))
    dates = pd.bdate_range("2021-01-04", periods=days)
    names = [f"A{i}" for i in range(assets)]
    frame = pd.DataFrame(prices, index=dates.strftime("%Y-%m-%d"), columns=names)
    frame.index.name = "date"
    prices_path = os.path.join(folder, "prices.csv")
    holdings_path = os.path.join(folder, "holdings.csv")
    frame.to_csv(prices_path, float_format="%.17g")
    pd.DataFrame({"asset": names, "quantity": 100 + 10 * np.arange(assets)}).to_csv(holdings_path, index=False)
    return prices_path, holdings_path


def smoke(build):
    cli = os.path.join(build, "app", "cli", "tailwise-cli")
    if not os.access(cli, os.X_OK):
        sys.exit(f"side_by_side: {cli} is missing")
    with tempfile.TemporaryDirectory(prefix="tailwise-smoke-") as folder:
        prices_path, holdings_path = write_small_book(folder)
        prices = read_prices(prices_path)
        p = prices.to_numpy()
        cov = reference_covariance(p[1:] / p[:-1] - 1.0)
        exposures, _ = exposures_for(prices, holdings_path)
        var, es = normal_var_es(cov, exposures, 0.99)
        tool = run_cli(cli, ["--prices", prices_path, "--holdings", holdings_path])
        mc = run_cli(cli, ["--prices", prices_path, "--holdings", holdings_path, "--model", "monte-carlo",
                           "--simulations", "100000"])
    failures = []
    for name, ours, theirs in (("normal VaR", tool["var"], var), ("normal ES", tool["es"], es)):
        if abs(ours - theirs) > 1e-9 * abs(theirs):
            failures.append(f"{name}: tool {ours!r}, NumPy {theirs!r}, tolerance 1e-9 relative")
    se = mc["standard_error"]
    if abs(mc["var"] - var) > 4 * se:
        failures.append(f"Monte Carlo VaR: tool {mc['var']!r}, closed form {var!r}, tolerance 4 SE = {4 * se!r}")
    for key in ("load", "estimate", "risk"):
        if key not in tool["timings_ms"]:
            failures.append(f"timings_ms lacks {key}")
    if "simulate" not in mc["timings_ms"] or "simulate" in tool["timings_ms"]:
        failures.append("timings_ms.simulate should be given for Monte Carlo only")
    for f in failures:
        print("side_by_side --smoke:", f)
    if failures:
        sys.exit(1)
    print(f"side_by_side --smoke: the tool agrees with NumPy (normal VaR {var:.4f}, ES {es:.4f}; "
          f"Monte Carlo VaR {mc['var']:.2f} within 4 SE of the closed form)")


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--build", default=os.path.join(os.path.dirname(__file__), "..", "..", "build"))
    parser.add_argument("--runs", type=int, default=5)
    parser.add_argument("--smoke", action="store_true")
    args = parser.parse_args()
    if args.smoke:
        smoke(args.build)
    else:
        full_run(args.build, args.runs)


if __name__ == "__main__":
    main()
