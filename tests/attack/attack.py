#!/usr/bin/python3
"""Every case of the reliability work thrown at the built command line.

Usage: attack.py TAILWISE_CLI FAILWRITE_LIBRARY|none SAMPLES_DIR

Each case runs tailwise-cli and asserts: the exit code the case calls for (never a crash: no
signal, no 134/139), a message on the error stream naming the problem, and every input file
byte-for-byte unchanged (and, for a failed save, the previous output file too). The full-disk
cases preload failwrite (a stand-in for a full disk, see failwrite.cpp) and fail the write after
a number of bytes, or fail fsync. Prints one line per case; exits 1 when any case fails.
"""
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

CLI, PRELOAD, SAMPLES = sys.argv[1], sys.argv[2], sys.argv[3]
failures = []
count = 0


def run(args, env_extra=None, stdout_path=None):
    env = dict(os.environ)
    env.setdefault("QT_QPA_PLATFORM", "offscreen")
    if env_extra:
        env.update(env_extra)
    out = open(stdout_path, "wb") if stdout_path else subprocess.PIPE
    try:
        p = subprocess.run([CLI] + args, stdout=out, stderr=subprocess.PIPE, env=env, timeout=120)
    finally:
        if stdout_path:
            out.close()
    return p.returncode, (p.stdout or b""), p.stderr.decode("utf-8", "replace")


def snapshot(paths):
    return {p: open(p, "rb").read() for p in paths if os.path.isfile(p)}


def case(name, args, code, words, inputs=(), env=None, stdout_path=None, check=None):
    """Runs one case; `words` must all appear in the error stream (case-sensitive)."""
    global count
    count += 1
    before = snapshot(inputs)
    rc, out, err = run(args, env, stdout_path)
    problems = []
    if rc < 0 or rc > 2:
        problems.append("exit %d (a crash or an undocumented status)" % rc)
    elif rc != code:
        problems.append("exit %d, expected %d" % (rc, code))
    for w in words:
        if w not in err:
            problems.append("the message lacks %r" % w)
    if "\x1b" in err:
        problems.append("a raw escape character reached the error stream")
    after = snapshot(inputs)
    for p, data in before.items():
        if after.get(p) != data:
            problems.append("%s changed" % p)
    if check and not problems:
        extra = check(rc, out, err)
        if extra:
            problems.append(extra)
    status = "ok  " if not problems else "FAIL"
    print("%s %s" % (status, name))
    if problems:
        failures.append(name)
        print("     " + "; ".join(problems))
        print("     stderr: " + err.strip()[:400].replace("\n", "\n             "))


work = tempfile.mkdtemp(prefix="tailwise-attack-")
try:
    def path(name):
        return os.path.join(work, name)

    def write(name, data):
        mode = "wb" if isinstance(data, bytes) else "w"
        with open(path(name), mode) as f:
            f.write(data)
        return path(name)

    prices = shutil.copy(os.path.join(SAMPLES, "prices.csv"), path("prices.csv"))
    holdings = shutil.copy(os.path.join(SAMPLES, "holdings.csv"), path("holdings.csv"))
    book = shutil.copy(os.path.join(SAMPLES, "larchmere.tailwise"), path("book.tailwise"))
    inputs = [prices, holdings, book]
    csv = ["--prices", prices, "--holdings", holdings]
    sample = json.load(open(book))

    def workbook(name, change):
        d = json.loads(json.dumps(sample))
        change(d)
        return write(name, json.dumps(d))

    # ---- 1. a save that failed never looks like a save ----------------------------------------
    rc, out, err = run(["var"] + csv + ["--json"])
    assert rc == 0, err
    case("1 stdout on a full disk (var --json > /dev/full)", ["var"] + csv + ["--json"], 1,
         ["could not write the output", "No space left on device"], inputs, stdout_path="/dev/full")
    case("1 stdout on a full disk (var text)", ["var"] + csv, 1, ["could not write the output"], inputs,
         stdout_path="/dev/full")
    if PRELOAD != "none":
        full = {"LD_PRELOAD": PRELOAD}
        kept = write("kept.tailwise", b"previous workbook\n")
        for n in (0, 1, 100, 4096, 65536):
            case("1 pack, disk full after %d bytes" % n, ["pack"] + csv + ["--out", kept], 1,
                 ["kept.tailwise", "No space left on device"], inputs + [kept],
                 env=dict(full, TAILWISE_FAIL_WRITE_AFTER=str(n)))
        case("1 pack, fsync fails", ["pack"] + csv + ["--out", kept], 1, ["kept.tailwise", "No space left on device"],
             inputs + [kept], env=dict(full, TAILWISE_FAIL_FSYNC="1"))
        for fmt in ("svg", "pdf", "png"):
            old = write("kept." + fmt, b"previous picture\n")
            for n in (0, 1000):
                case("1 render %s, disk full after %d bytes" % (fmt, n),
                     ["render", book, "--chart", "loss-tail", "--out", old], 1,
                     ["could not save", "kept." + fmt, "No space left on device"], inputs + [old],
                     env=dict(full, TAILWISE_FAIL_WRITE_AFTER=str(n)))
        oldxlsx = write("kept.xlsx", b"previous tables\n")
        for n in (0, 3000):
            case("1 var --xlsx, disk full after %d bytes" % n, ["var"] + csv + ["--xlsx", oldxlsx], 1,
                 ["kept.xlsx", "could not"], inputs + [oldxlsx], env=dict(full, TAILWISE_FAIL_WRITE_AFTER=str(n)))
        oldpdf = write("kept-report.pdf", b"previous report\n")
        for n in (0, 5000):
            case("1 report, disk full after %d bytes" % n, ["report", book, "--out", oldpdf], 1,
                 ["could not save", "kept-report.pdf", "No space left on device"], inputs + [oldpdf],
                 env=dict(full, TAILWISE_FAIL_WRITE_AFTER=str(n)))
        case("1 report, fsync fails", ["report", book, "--out", oldpdf], 1, ["could not save", "No space left"],
             inputs + [oldpdf], env=dict(full, TAILWISE_FAIL_FSYNC="1"))

    # ---- 2. output never destroys input, never replaces a special file ------------------------
    case("2 pack --out the prices file", ["pack"] + csv + ["--out", prices], 2, ["--out", "is the input", "prices.csv"],
         inputs)
    case("2 pack --out the holdings by another spelling",
         ["pack"] + csv + ["--out", os.path.join(work, ".", "..", os.path.basename(work), "holdings.csv")], 2,
         ["is the input", "holdings.csv"], inputs)
    link = path("hardlink.tailwise")
    os.link(book, link)
    case("2 render --out the workbook (a hard link)", ["render", book, "--chart", "models", "--out", link,
                                                       "--format", "svg"], 2, ["is the input"], inputs)
    case("2 report --out the workbook itself", ["report", book, "--out", book], 2, ["is the input", "book.tailwise"],
         inputs)
    case("2 var --xlsx the prices file", ["var"] + csv + ["--xlsx", prices], 2, ["--xlsx", "is the input", "prices.csv"],
         inputs)
    case("2 backtest --xlsx the workbook", ["backtest", "--workbook", book, "--xlsx", book], 2,
         ["--xlsx", "is the input", "book.tailwise"], inputs)
    batch_list = write("books.csv", book + "\n")  # a list named like a results file
    case("2 batch --out the list of workbooks", ["batch", "--list", batch_list, "--out", batch_list], 2,
         ["--out", "is the input", "books.csv"], inputs + [batch_list])
    for device in ("/dev/null", "/dev/full"):
        case("2 pack --out %s" % device, ["pack"] + csv + ["--out", device], 1, ["not saved", device, "a device"],
             inputs)
    fifo = path("pipe.svg")
    os.mkfifo(fifo)
    case("2 render --out a FIFO", ["render", book, "--chart", "models", "--out", fifo], 1, ["FIFO"], inputs)
    case("2 render --out a folder", ["render", book, "--chart", "models", "--out", work, "--format", "svg"], 1,
         ["a folder"], inputs)
    case("2 render --out - is standard output", ["render", book, "--chart", "models", "--out", "-", "--format", "svg"],
         0, [], inputs, check=lambda rc, out, err: None if out.lstrip().startswith(b"<?xml") and not os.path.exists("-")
         else "no SVG on standard output")
    case("2 report --out - is standard output", ["report", book, "--out", "-"], 0, [], inputs,
         check=lambda rc, out, err: None if out.startswith(b"%PDF") else "no PDF on standard output")
    case("2 pack --out - is standard output", ["pack"] + csv + ["--out", "-"], 0, [], inputs,
         check=lambda rc, out, err: None if json.loads(out)["kind"] == "tailwise-workbook" else "no workbook")

    # ---- 3. no crash on any input ------------------------------------------------------------
    for c in ("1e-17", "0.4999", "0.99995", "0.9999999999999999", "1e308"):
        case("3 var --confidence %s" % c, ["var"] + csv + ["--confidence", c], 2, ["--confidence", "0.5", "0.9999"],
             inputs)
    case("3 pack --confidence 1e-17 writes nothing", ["pack"] + csv + ["--confidence", "1e-17", "--out", path("c.tailwise")],
         2, ["--confidence"], inputs, check=lambda *a: "a file was written" if os.path.exists(path("c.tailwise")) else None)
    bad_conf = workbook("conf.tailwise", lambda d: d["assumptions"].update(confidence=1e-17))
    for cmd in (["var", "--workbook", bad_conf], ["backtest", "--workbook", bad_conf],
                ["render", bad_conf, "--chart", "models", "--out", path("x.svg")], ["report", bad_conf, "--out", path("x.pdf")]):
        case("3 %s on a workbook with confidence 1e-17" % cmd[0], cmd, 1, ["assumptions.confidence", "0.5"], inputs + [bad_conf])
    case("3 --dof 2.0000001 student-t", ["var"] + csv + ["--model", "student-t", "--dof", "2.0000001", "--json"], 0,
         ["below 3"], inputs)
    case("3 --simulations at the edge", ["var"] + csv + ["--model", "monte-carlo", "--simulations", "999"], 2,
         ["--simulations"], inputs)

    # ---- 4. bounded memory and size -----------------------------------------------------------
    long_title = workbook("title.tailwise", lambda d: d.update(title="T" * (1 << 20)))
    case("4 a 1 MiB workbook title", ["var", "--workbook", long_title], 1, ["title", "longer than 200 characters"],
         inputs + [long_title])
    case("4 pack --title of 201 characters", ["pack"] + csv + ["--title", "t" * 201, "--out", path("t.tailwise")], 2,
         ["--title", "200 characters"], inputs)
    long_name = write("longname.csv", open(prices).read().replace("LARK_ENERGY", "L" * 101, 1))
    case("4 an asset name of 101 characters", ["var", "--prices", long_name, "--holdings", holdings], 1,
         ["longname.csv, line 1, column 2", "longer than 100 characters"], inputs + [long_name])
    n = 20000
    big_prices = write("big-prices.csv", "date," + ",".join("A%d" % i for i in range(n)) + "\n"
                       + "".join("2024-01-0%d," % (d + 2) + ",".join(["%d" % (100 + d)] * n) + "\n" for d in range(3)))
    big_holdings = write("big-holdings.csv", "asset,quantity\n" + "".join("A%d,1\n" % i for i in range(n)))
    case("4 20,000 assets x 3 rows refused before any N x N work",
         ["var", "--prices", big_prices, "--holdings", big_holdings], 1, ["20000 holdings with only 2 daily returns"],
         [big_prices, big_holdings])

    # ---- 5. no figure that is silently wrong --------------------------------------------------
    lines = open(prices).read().splitlines()
    tiny = write("tiny.csv", "\n".join([lines[0]] + [",".join(l.split(",")[:1] + ["5e-324"] + l.split(",")[2:])
                                                    for l in lines[1:]]) + "\n")
    for cmd in ("var", "backtest", "pack"):
        extra = {"var": [], "backtest": ["--window", "50"], "pack": ["--out", path("tiny.tailwise")]}[cmd]
        case("5 %s on subnormal prices" % cmd, [cmd, "--prices", tiny, "--holdings", holdings] + extra, 1,
             ["tiny.csv, line 2, column 2", "subnormal"], inputs + [tiny])
    tiny_book = workbook("tiny.tailwise", lambda d: d["prices"]["rows"][1].__setitem__(0, 5e-324))
    case("5 a workbook with a subnormal price", ["var", "--workbook", tiny_book], 1,
         ["prices.rows[1][0]", "subnormal"], inputs + [tiny_book])
    over = write("overflow.csv", "\n".join([lines[0], lines[1], lines[2].split(",")[0] + ",1e-300," + ",".join(lines[2].split(",")[2:]),
                                           lines[3].split(",")[0] + ",1e300," + ",".join(lines[3].split(",")[2:])]
                                          + lines[4:]) + "\n")
    case("5 a return that overflows", ["var", "--prices", over, "--holdings", holdings], 1,
         ["overflow.csv, line 4, column 2", "overflows"], inputs + [over])
    # One crash day in a calm history: a P&L far from normal (large excess kurtosis), where the
    # Cornish-Fisher expansion is not monotone.
    calm = ["date,A,B"]
    a = b = 100.0
    for d in range(60):
        a *= 1.001 if d % 2 else 0.999
        b *= 0.9995 if d % 2 else 1.0005
        if d == 40:
            a *= 0.3
        calm.append("2024-%02d-%02d,%.6f,%.6f" % (1 + d // 28, 1 + d % 28, a, b))
    calm_prices = write("calm.csv", "\n".join(calm) + "\n")
    calm_holdings = write("calm-holdings.csv", "asset,quantity\nA,100\nB,100\n")

    def es_not_below_var(rc, out, err):
        d = json.loads(out)
        fig = d.get("figures", d)
        var = fig.get("var")
        es = fig.get("es")
        if var is None or es is None:
            return "no var/es in the JSON"
        return None if es >= var else "ES %g below VaR %g" % (es, var)

    case("5 Cornish-Fisher outside its monotone domain (JSON)",
         ["var", "--prices", calm_prices, "--holdings", calm_holdings, "--model", "cornish-fisher", "--json"], 0,
         ["not monotone"], [calm_prices, calm_holdings], check=es_not_below_var)
    case("5 Cornish-Fisher outside its monotone domain (text)",
         ["var", "--prices", calm_prices, "--holdings", calm_holdings, "--model", "cornish-fisher"], 0, [],
         [calm_prices, calm_holdings],
         check=lambda rc, out, err: None if b"not monotone" in out else "no warning in the text output")
    case("5 dof just above 2", ["var"] + csv + ["--model", "student-t", "--dof", "2.05", "--json"], 0, ["below 3"], inputs)
    case("5 horizon of 10,000 days", ["var"] + csv + ["--horizon", "10000", "--window", "100", "--json"], 0,
         ["longer than the 100 daily returns"], inputs)
    case("5 VaR above the value of a long-only book",
         ["var", "--value", "1000000", "--volatility", "0.6", "--horizon", "10000", "--json"], 0,
         ["exceeds the portfolio's value"], [])

    # ---- 6. output other programs can read ----------------------------------------------------
    esc = write("esc.csv", open(prices).read().replace("LARK_ENERGY", "LARK\x1b[31mENERGY", 1))
    case("6 an escape character in an asset name", ["var", "--prices", esc, "--holdings", holdings], 1,
         ["esc.csv, line 1, column 2", "control character (U+001B)"], inputs + [esc])
    bad_utf8 = write("utf8.csv", open(prices, "rb").read().replace(b"LARK_ENERGY", b"LARK\xffENERGY", 1))
    case("6 invalid UTF-8 in an asset name", ["var", "--prices", bad_utf8, "--holdings", holdings], 1,
         ["utf8.csv, line 1, column 2", "UTF-8"], inputs + [bad_utf8])
    ctl_book = workbook("ctl.tailwise", lambda d: d.update(title="Fund\u001b[2J"))
    case("6 a control character in a workbook title", ["var", "--workbook", ctl_book], 1,
         ["title", "control character"], inputs + [ctl_book])
    accented = write("accented.csv", open(prices).read().replace("LARK_ENERGY", "LÄRK_ÉNERGY_€", 1))
    accented_h = write("accented-h.csv", open(holdings).read().replace("LARK_ENERGY", "LÄRK_ÉNERGY_€", 1))

    def valid_json(rc, out, err):
        try:
            json.loads(out.decode("utf-8", "strict"))
        except Exception as e:  # noqa: BLE001
            return "not valid JSON in UTF-8: %s" % e
        return None

    case("6 JSON with non-ASCII names is valid UTF-8", ["var", "--prices", accented, "--holdings", accented_h, "--json"],
         0, [], [accented, accented_h], check=valid_json)
    flat = write("flat.csv", "date,A,B\n" + "".join("2024-01-%02d,100,50\n" % (d + 1) for d in range(20)))
    flat_h = write("flat-h.csv", "asset,quantity\nA,1\nB,2\n")
    flat_book = path("flat.tailwise")
    assert run(["pack", "--prices", flat, "--holdings", flat_h, "--out", flat_book])[0] == 0

    def finite_svg(rc, out, err):
        text = open(path("flat.svg"), encoding="utf-8").read() if rc == 0 else ""
        if re.search(r"\b(inf|nan|NaN|Infinity)\b", text):
            return "a non-finite number in the SVG"
        return None

    for kind in ("loss-tail", "tradeoff", "contributions", "models"):
        rc, _, _ = run(["render", flat_book, "--chart", kind, "--out", path("flat.svg")])
        case("6 SVG of a zero-variance book has finite numbers (%s)" % kind,
             ["render", flat_book, "--chart", kind, "--out", path("flat.svg")], rc, [], [flat, flat_h, flat_book],
             check=finite_svg)

    # ---- 7. ambiguous input is refused -------------------------------------------------------
    both = workbook("both.tailwise", lambda d: d["holdings"][0].update(value=100000))
    case("7 a workbook holding with both a quantity and a value", ["var", "--workbook", both], 1,
         ["holdings[0]", "both a \"quantity\" and a \"value\""], inputs + [both])
    for args, option in ((["var"] + csv + ["--confidence", "0.95", "--confidence", "0.99"], "--confidence"),
                         (["var", "--workbook", book, "--workbook", book], "--workbook"),
                         (["var"] + csv + ["--window", "100", "--window", "200"], "--window"),
                         (["backtest"] + csv + ["--window", "100", "--window", "200"], "--window"),
                         (["render", book, "--chart", "models", "--chart", "loss-tail", "--out", path("r.svg")], "--chart"),
                         (["render", book, "--chart", "models", "--out", path("r.svg"), "--out", path("s.svg")], "--out"),
                         (["report", book, "--out", path("r.pdf"), "-o", path("s.pdf")], "--out"),
                         (["pack"] + csv + ["--title", "a", "--title", "b", "--out", path("p.tailwise")], "--title"),
                         (["var"] + csv + ["--xlsx", path("a.xlsx"), "--xlsx", path("b.xlsx")], "--xlsx"),
                         (["var"] + csv + ["--as-of", "2026-01-05", "--as-of", "2026-01-06"], "--as-of"),
                         (["batch", book, "--out", path("a.csv"), "--out", path("b.csv")], "--out"),
                         (["history", path("h.db"), "--workbook", "a", "--workbook", "b"], "--workbook")):
        case("7 %s given twice (%s)" % (option, args[0]), args, 2, [option, "given more than once"], inputs)
    rc, out, err = run(["var", "--help"])
    case("7 --help says which options repeat", ["var", "--help"], 0, [], [],
         check=lambda rc, out, err: None if out.count(b"repeatable") >= 2 else "no word of the repeatable options")
finally:
    shutil.rmtree(work, ignore_errors=True)

print("%d cases, %d failed" % (count, len(failures)))
sys.exit(1 if failures else 0)
