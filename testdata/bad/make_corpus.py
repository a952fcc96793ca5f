#!/usr/bin/env python3
"""Writes the bad-input corpus: one folder per case with a manuscript
(paper.md), its data, and want.txt (first line: the exit code; then the
substrings the error message must contain, in order). Run from this
folder; the output is committed. Byte-level cases (BOM, CRLF, non-UTF-8)
are why this is a script rather than hand-written files."""
import math, os, shutil

FRONT = "---\ntitle: Bad input\ndata:\n  d: data.csv\n---\n\n"

def monthly(n, start=2000):
    return [f"{start + i // 12}-{i % 12 + 1:02d}" for i in range(n)]

def csv(cols, n=60, dates=None, sep=","):
    dates = dates or monthly(n)
    head = sep.join(["date"] + list(cols))
    rows = [sep.join([dates[i]] + [cols[c](i) for c in cols]) for i in range(len(dates))]
    return head + "\n" + "\n".join(rows) + "\n"

def rw(seed):
    # a deterministic wiggle, not random: enough for a regression
    return lambda i: f"{10 + math.sin(i * seed) + 0.05 * i:.6f}"

def case(name, manuscript, files, want, exit_code=1, raw=None):
    os.makedirs(name, exist_ok=True)
    with open(os.path.join(name, "paper.md"), "wb") as f:
        f.write(manuscript.encode() if isinstance(manuscript, str) else manuscript)
    for fn, body in files.items():
        with open(os.path.join(name, fn), "wb") as f:
            f.write(body.encode() if isinstance(body, str) else body)
    with open(os.path.join(name, "want.txt"), "w") as f:
        f.write(f"exit {exit_code}\n" + "\n".join(want) + ("\n" if want else ""))

for d in os.listdir("."):
    if os.path.isdir(d):
        shutil.rmtree(d)

ols = "```galley ols\nid: m\ndata: d\ny: y\nx: [x]\n```\n"
good = {"y": rw(1.0), "x": rw(0.7)}

# Non-finite and huge values
def at(i0, text, base):
    return lambda i: text if i == i0 else base(i)

# NaN is a missing-value marker: inside the sample it is a gap.
case("nan-value", FRONT + ols, {"data.csv": csv({"y": at(14, "NaN", rw(1.0)), "x": rw(0.7)})},
     ["data.csv:16", "y", "2001-03"])
case("inf-value", FRONT + ols, {"data.csv": csv({"y": at(14, "Inf", rw(1.0)), "x": rw(0.7)})},
     ["data.csv:16", "column y", "infinite value"])
case("huge-value", FRONT + "```galley ols\nid: m\ndata: d\ny: y\nx: [x]\n```\n",
     {"data.csv": csv({"y": rw(1.0), "x": at(5, "1e300", rw(0.7))})}, ["paper.md:11:", "x is 1e+300 on 2000-06 (line 7)", "rescale"])
case("constant-series", FRONT + "```galley adf\nid: a\ndata: d\nseries: k\nlags: 1\n```\n",
     {"data.csv": csv({"k": lambda i: "5"})}, ["paper.md:10:", "constant"])
case("near-singular", FRONT + "```galley ols\nid: m\ndata: d\ny: y\nx: [x, z]\n```\n",
     {"data.csv": csv({"y": rw(1.0), "x": rw(0.7), "z": lambda i: f"{float(rw(0.7)(i)) * 2 + 1e-9 * (i % 3):.15f}"})},
     ["paper.md:11:", '"z" is collinear with const, x'])
# Nearly but not exactly collinear: the estimates are reported with a warning.
case("near-singular-warn", FRONT + "```galley ols\nid: m\ndata: d\ny: y\nx: [x, z]\n```\n",
     {"data.csv": csv({"y": rw(1.0), "x": rw(0.7), "z": lambda i: f"{float(rw(0.7)(i)) + 1e-8 * math.sin(3 * i):.17g}"})},
     ["Warning: the regressors are nearly collinear"], exit_code=0)
case("too-many-lags", FRONT + "```galley adf\nid: a\ndata: d\nseries: y\nlags: 12\n```\n",
     {"data.csv": csv({"y": rw(1.0)}, n=10)}, ["paper.md:10:", "ADF of y", "too few observations"])
case("duplicate-dates", FRONT + ols, {"data.csv": csv(good, dates=monthly(10) + ["2000-10"] + monthly(20)[11:])},
     ["data.csv:12", "2000-10 appears twice, on lines 11 and 12"])
case("unsorted-dates", FRONT + ols, {"data.csv": csv(good, dates=monthly(5) + ["2000-07", "2000-06"] + monthly(20)[7:])},
     ["data.csv:7", "2000-07 follows 2000-05", "2000-06 is missing"])
case("mixed-frequencies", FRONT + ols, {"data.csv": csv(good, dates=monthly(5) + ["2000Q2"] + monthly(20)[6:])},
     ["data.csv:7", "2000Q2 is quarterly but the dates above are monthly"])
# Accepted: a byte-order mark, CRLF line ends, semicolons.
case("bom-crlf", FRONT.replace("\n", "\r\n") + ols.replace("\n", "\r\n"),
     {"data.csv": "\ufeff" + csv(good, sep=";").replace("\n", "\r\n")}, [], exit_code=0)
case("non-utf8-manuscript", FRONT.encode() + b"Caf\xe9 prices.\n\n" + ols.encode(), {"data.csv": csv(good)},
     ["paper.md:7:", "not valid UTF-8"])
case("non-utf8-data", FRONT + ols, {"data.csv": b"date,y,x\xff\n" + csv(good).split("\n", 1)[1].encode()},
     ["data.csv:1", "not valid UTF-8"])
case("empty-data", FRONT + ols, {"data.csv": ""}, ["data.csv", "empty"])
case("empty-manuscript", "", {}, [], exit_code=0)
case("interior-gap", FRONT + ols, {"data.csv": csv({"y": at(30, "", rw(1.0)), "x": rw(0.7)})},
     ["data.csv:32", "y", "2002-07"])
case("escape-symlink", "---\ndata:\n  d: link.csv\n---\n\n" + ols, {}, ["paper.md:8:", "link that leads outside the manuscript's folder"])
case("escape-dotdot", "---\ndata:\n  d: ../outside.csv\n---\n\n" + ols, {}, ["paper.md:8:", "outside the manuscript's folder"])
case("escape-absolute", "---\ndata:\n  d: /etc/passwd\n---\n\n" + ols, {}, ["paper.md:8:", "absolute"])
os.symlink("../../data/macrodata.csv", "escape-symlink/link.csv")
