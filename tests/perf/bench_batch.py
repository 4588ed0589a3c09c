#!/usr/bin/python3
"""Benchmark of `tailwise-cli batch`: writes N invented workbooks of H holdings each (a seeded
random walk of 750 days over 60 invented assets, each workbook a different draw of holdings), then
times `batch --list` over them with -j set to the processor count, and prints the figures.
Not a pass/fail test: run it by hand on an idle machine.
    /usr/bin/python3 tests/perf/bench_batch.py [--build build] [--workbooks 500] [--holdings 50]"""
import argparse
import json
import os
import random
import subprocess
import sys
import tempfile
import time


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--build", default="build")
    ap.add_argument("--workbooks", type=int, default=500)
    ap.add_argument("--holdings", type=int, default=50)
    ap.add_argument("--days", type=int, default=750)
    ap.add_argument("--runs", type=int, default=3)
    a = ap.parse_args()
    cli = os.path.join(a.build, "app", "cli", "tailwise-cli")
    rng = random.Random(21)
    assets = ["ASSET_%03d" % i for i in range(max(60, a.holdings))]
    prices = [[100.0 + 10 * rng.random() for _ in assets]]
    for _ in range(a.days - 1):
        prices.append([p * (1.0 + rng.gauss(0.0, 0.012)) for p in prices[-1]])
    dates = []
    y, m, d = 2023, 1, 2
    for i in range(a.days):  # consecutive calendar days: only order matters here
        dates.append("%04d-%02d-%02d" % (y, m, d))
        d += 1
        if d > 28:
            d, m = 1, m + 1
        if m > 12:
            m, y = 1, y + 1
    with tempfile.TemporaryDirectory() as tmp:
        paths = []
        for w in range(a.workbooks):
            chosen = rng.sample(assets, a.holdings)
            book = {
                "kind": "tailwise-workbook", "format": 1, "title": "Invented book %d" % w,
                "prices": {"assets": assets, "dates": dates, "rows": prices},
                "holdings": [{"asset": s, "quantity": rng.randint(10, 1000)} for s in chosen],
                "assumptions": {"confidence": 0.99, "horizon": 1, "window": 500},
            }
            path = os.path.join(tmp, "book%04d.tailwise" % w)
            with open(path, "w") as f:
                json.dump(book, f)
            paths.append(path)
        listing = os.path.join(tmp, "books.txt")
        with open(listing, "w") as f:
            f.write("\n".join(paths) + "\n")
        times = []
        for _ in range(a.runs):
            start = time.perf_counter()
            r = subprocess.run([cli, "batch", "--list", listing, "--out", os.path.join(tmp, "out.jsonl")],
                               capture_output=True, text=True)
            times.append(time.perf_counter() - start)
            if r.returncode != 0:
                sys.exit("batch failed: " + r.stderr)
        times.sort()
        print("batch: %d workbooks x %d holdings (%d days, %d assets each), -j %d: median %.2f s, best %.2f s"
              % (a.workbooks, a.holdings, a.days, len(assets), os.cpu_count(), times[len(times) // 2], times[0]))


if __name__ == "__main__":
    main()
