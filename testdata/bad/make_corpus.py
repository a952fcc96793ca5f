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
        os.makedirs(os.path.dirname(os.path.join(name, fn)), exist_ok=True)
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

# ---------------------------------------------------------------------
# Issue 14: real-world data and hostile input. Each class below failed
# (a wrong result, a hang, a crash or an unclear message) before it was
# fixed; the cases keep it from coming back.

import io, zipfile

def quarterly_iso(n, y0=1974, end=False):
    out = []
    for i in range(n):
        y, q = y0 + i // 4, i % 4 + 1
        out.append(f"{y}-{3*q:02d}-{[31, 30, 30, 31][q-1]}" if end else f"{y}-{3*q-2:02d}-01")
    return out

def monthly_iso(n, y0=2000, end=False):
    import calendar
    out = []
    for i in range(n):
        y, m = y0 + i // 12, i % 12 + 1
        out.append(f"{y}-{m:02d}-{calendar.monthrange(y, m)[1]:02d}" if end else f"{y}-{m:02d}-01")
    return out

def fm(data="data.csv", extra=""):
    return f"---\ntitle: Bad input\ndata:\n  d: {data}\n---\n\n" + extra

def block(kind, body):
    return f"```galley {kind}\nid: m\ndata: d\n{body}```\n"

adf_q = block("adf", "series: y\nlags: 1\nsample: 1975Q1..\n")
# 1. Calendar-dated quarters and months are read as quarters and months.
case("iso-quarterly-first-day", fm() + adf_q, {"data.csv": csv(good, dates=quarterly_iso(60))},
     ["Sample 1975Q1–1988Q4"], exit_code=0)
case("iso-quarterly-last-day", fm() + adf_q, {"data.csv": csv(good, dates=quarterly_iso(60, end=True))},
     ["Sample 1975Q1–1988Q4"], exit_code=0)
case("iso-monthly-first-day", fm() + block("summary-stats", "series: [y]\n"), {"data.csv": csv(good, dates=monthly_iso(30))},
     ["| 2000-01 | 2002-06 |"], exit_code=0)
case("iso-monthly-last-day", fm() + block("adf", "series: y\nlags: 1\nsample: 2001-01..\n"), {"data.csv": csv(good, dates=monthly_iso(40, end=True))},
     ["Sample 2001-01–2003-04"], exit_code=0)
case("iso-half-life-in-quarters", fm() + "```galley engle-granger\nid: eg\ndata: d\ny: y\nx: [x]\nlags: 1\n```\n\n```galley ecm\nid: e\nfrom: eg\n```\n",
     {"data.csv": csv({"y": rw(1.0), "x": rw(0.7)}, dates=quarterly_iso(60))}, ["in quarters", "Sample 1974Q3–1988Q4"], exit_code=0)
q_gap = quarterly_iso(20)
case("iso-quarterly-gap", fm() + ols, {"data.csv": csv(good, dates=q_gap[:5] + q_gap[6:])},
     ["data.csv:7", "1975-07-01 (1975Q3) follows 1975-01-01 (1975Q1, line 6): 1975Q2 is missing", "declare the frequency"])
case("iso-business-days-stay-daily", fm() + block("summary-stats", "series: [y]\n"),
     {"data.csv": csv(good, dates=["2020-03-02", "2020-03-03", "2020-03-04", "2020-03-05", "2020-03-06", "2020-03-09", "2020-03-10"])},
     ["| 2020-03-02 | 2020-03-10 |"], exit_code=0)
case("declared-quarterly-mid-quarter", fm("{path: data.csv, frequency: quarterly}") + adf_q,
     {"data.csv": csv(good, dates=[d[:5] + f"{int(d[5:7])+1:02d}-1{i % 5}" for i, d in enumerate(quarterly_iso(60))])},
     ["Sample 1975Q1–1988Q4"], exit_code=0)
case("declared-frequency-unknown", fm("{path: data.csv, frequency: fortnightly}") + ols, {"data.csv": csv(good)},
     ["paper.md:4:", 'frequency "fortnightly": expected annual, quarterly, monthly or daily'])
case("declared-two-dates-in-a-quarter", fm("{path: data.csv, frequency: quarterly}") + ols,
     {"data.csv": csv(good, dates=monthly_iso(24))}, ["data.csv:3", "2000-01-01 (line 2) and 2000-02-01 both fall in 2000Q1"])
case("declared-against-the-date-form", fm("{path: data.csv, frequency: quarterly}") + ols, {"data.csv": csv(good)},
     ["paper.md:9:", "the data are declared quarterly but the dates are monthly (2000-01 on line 2)"])
case("declared-daily-refuses-quarters", fm("{path: data.csv, frequency: daily}") + adf_q, {"data.csv": csv(good, dates=quarterly_iso(60))},
     ["paper.md:12:", "sample 1975Q1.. is quarterly but the data are daily"])
case("declared-on-undated-data", fm("{path: data.csv, frequency: annual}") + ols,
     {"data.csv": "y,x\n" + "".join(f"{rw(1.0)(i)},{rw(0.7)(i)}\n" for i in range(30))},
     ["paper.md:9:", "the data are declared annual but the data have no date column"])

# 2. An ECM's extra regressor costs no observation of its own.
case("ecm-extra-first-date", fm() + "```galley engle-granger\nid: eg\ndata: d\ny: y\nx: [x]\nlags: 1\n```\n\n```galley ecm\nid: e\nfrom: eg\nlags: 1\nextra: [diff(w)]\n```\n",
     {"data.csv": csv({"y": rw(1.0), "x": rw(0.7), "w": rw(0.3)}, dates=quarterly_iso(60))}, ["Sample 1974Q3–1988Q4, N = 58."], exit_code=0)

# 5. A constant series is refused wherever it would give rounding noise.
const = {"k": lambda i: "5", "x": rw(0.7), "y": rw(1.0)}
case("constant-y-ols", fm() + block("ols", "y: k\nx: [x]\n"), {"data.csv": csv(const)},
     ["paper.md:10:", "k is constant (5 at all 60 observations, 2000-01–2004-12): a regression cannot explain a series that does not vary"])
case("constant-log-y-ols-no-const", fm() + block("ols", "y: log(k)\nx: [x]\nconst: false\n"), {"data.csv": csv(const)},
     ["paper.md:10:", "log(k) is constant (1.60944 at all 60 observations"])
case("constant-y-engle-granger", fm() + block("engle-granger", "y: k\nx: [x]\n"), {"data.csv": csv(const)},
     ["paper.md:10:", "k is constant", "a cointegration test needs series that vary"])
case("constant-x-engle-granger", fm() + block("engle-granger", "y: y\nx: [x, k]\n"), {"data.csv": csv(const)},
     ["paper.md:11:", "k is constant", "a cointegration test needs series that vary"])
case("constant-y-po", fm() + block("po", "y: k\nx: [x]\n"), {"data.csv": csv(const)},
     ["paper.md:10:", "k is constant", "a cointegration test needs series that vary"])
case("constant-x-ols", fm() + block("ols", "y: y\nx: [k]\n"), {"data.csv": csv(const)},
     ["paper.md:11:", 'regressor "k" is collinear with const'])
case("constant-kpss", fm() + block("kpss", "series: k\n"), {"data.csv": csv(const)}, ["paper.md:10:", "KPSS of k", "constant"])
case("constant-summary-stats", fm() + block("summary-stats", "series: [k]\n"), {"data.csv": csv(const)}, ["| k | 60 | 5.000 | 0.000 |"], exit_code=0)
case("constant-in-sample-only", fm() + block("ols", "y: k\nx: [x]\nsample: 2001-01..2001-12\n"),
     {"data.csv": csv({"k": lambda i: "5" if 12 <= i < 24 else rw(1.0)(i), "x": rw(0.7)})},
     ["paper.md:10:", "k is constant (5 at all 12 observations, 2001-01–2001-12)"])

# 4. Windows that run past an earlier, shorter vintage.
VFRONT = "---\ntitle: Vintages\ndata:\n  d:\n    path: new.csv\n    vintage:\n      old: old.csv\n---\n\n"
vdata = {"new.csv": csv(good, n=120), "old.csv": csv(good, n=72)}
case("vintage-shade-past-the-end", VFRONT + "```galley figure\nid: f\ndata: d\nplot: lines\nseries: [y]\nshade:\n  - {from: 2005-06, to: 2006-06}\n  - {from: 2008-01, to: 2008-06}\n```\n\n```galley revision\nid: r\nagainst: old\n```\n",
     vdata, ['the paper built on the data vintage "old"'], exit_code=0)
case("vintage-grid-sample-past-the-end", VFRONT + "```galley grid\nid: g\nof: adf\ndata: d\nseries: y\nlags: 1\nover: {sample: [2000-01..2004-12, 2003-01..2008-12]}\n```\n\n```galley revision\nid: r\nagainst: old\n```\n",
     vdata, ["| g (grid) | cells 1 values stat (+0.65 \\|5% c.v.\\|)", 'the paper built on the data vintage "old"'], exit_code=0)
case("vintage-sample-nothing-left", VFRONT + "```galley adf\nid: a\ndata: d\nseries: y\nlags: 1\nsample: 2007-01..2009-12\n```\n\n```galley revision\nid: r\nagainst: old\n```\n",
     vdata, ["paper.md:20:", 'building vintage "old" failed', "paper.md:15:", "starts after the data", 'in the build on vintage "old" of data alias "d"'])
case("shade-outside-the-data", fm() + "```galley figure\nid: f\ndata: d\nplot: lines\nseries: [y]\nshade:\n  - {from: 2030-01, to: 2030-06}\n```\n",
     {"data.csv": csv(good)}, ["paper.md:13:", "shaded window 2030-01 to 2030-06 lies outside the plotted data, which run from 2000-01 to 2004-12"])
case("shade-past-the-end-is-cut", fm() + "```galley figure\nid: f\ndata: d\nplot: lines\nseries: [y]\nshade:\n  - {from: 2004-06, to: 2005-06}\n```\n",
     {"data.csv": csv(good)}, ["runs past the plotted data (2000-01 to 2004-12); it is shaded from 2004-06 to 2004-12"], exit_code=0)

# 6-8. Files that are not data: folders, workbooks that expand without
# bound, files that are no workbook at all. (Named pipes and devices
# cannot be committed: cmd/galley/badinput_test.go makes them.)
def xlsx(sheet_xml):
    parts = {
        "[Content_Types].xml": '<?xml version="1.0"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">'
            '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>'
            '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>'
            '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>',
        "_rels/.rels": '<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">'
            '<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>',
        "xl/workbook.xml": '<?xml version="1.0"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships">'
            '<sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>',
        "xl/_rels/workbook.xml.rels": '<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">'
            '<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/></Relationships>',
        "xl/worksheets/sheet1.xml": sheet_xml,
    }
    b = io.BytesIO()
    with zipfile.ZipFile(b, "w", zipfile.ZIP_DEFLATED) as z:
        for name, body in parts.items():
            zi = zipfile.ZipInfo(name, date_time=(2020, 1, 1, 0, 0, 0))
            zi.compress_type = zipfile.ZIP_DEFLATED
            z.writestr(zi, body)
    return b.getvalue()

SH = '<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>'
def istr(ref, t):
    return f'<c r="{ref}" t="inlineStr"><is><t>{t}</t></is></c>'
def sheet_rows(dates, extra=""):
    rows = [f'<row r="1">{istr("A1", "date")}{istr("B1", "y")}{istr("C1", "x")}</row>']
    for i, d in enumerate(dates):
        r = i + 2
        rows.append(f'<row r="{r}">{istr(f"A{r}", d)}<c r="B{r}"><v>{rw(1.0)(i)}</v></c><c r="C{r}"><v>{rw(0.7)(i)}</v></c></row>')
    return SH + "".join(rows) + extra + "</sheetData></worksheet>"

XFRONT = fm("data.xlsx")
case("xlsx-iso-quarters", XFRONT + adf_q, {"data.xlsx": xlsx(sheet_rows(quarterly_iso(60)))}, ["Sample 1975Q1–1988Q4"], exit_code=0)
case("xlsx-far-column-bomb", XFRONT + ols,
     {"data.xlsx": xlsx(sheet_rows(monthly(40), "".join(f'<row r="{r}"><c r="XFD{r}"/></row>' for r in range(50, 400))))},
     ["paper.md:9:", "data.xlsx", "the workbook spans more than 500000 cells", "reaches column XFD", "save the sheet as CSV"])
case("xlsx-blank-cell-bomb", XFRONT + ols,
     {"data.xlsx": xlsx(sheet_rows(monthly(40), ("<row>" + "<c/>" * 25 + "</row>") * 21000))},
     ["paper.md:9:", "the workbook spans more than 500000 cells", "save the sheet as CSV"])
case("xlsx-row-past-the-sheet", XFRONT + ols, {"data.xlsx": xlsx(sheet_rows(monthly(40), '<row r="2000000"><c r="A2000000"/></row>'))},
     ["paper.md:9:", "the workbook names row 2000000; a worksheet ends at row 1048576"])
case("xlsx-not-a-workbook", XFRONT + ols, {"data.xlsx": b"date,y,x\n2000-01,1,2\n"}, ["paper.md:9:", "data.xlsx", "not an .xlsx workbook"])
case("xlsx-empty-file", XFRONT + ols, {"data.xlsx": b""}, ["paper.md:9:", "data.xlsx", "not an .xlsx workbook"])
case("data-path-is-a-folder", fm("sub") + ols, {"sub/keep.txt": "x"}, ["paper.md:9:", "is a folder, not a file"])
case("data-file-missing", fm("nothere.csv") + ols, {}, ["paper.md:9:", "does not exist"])
case("sheet-on-csv", fm("{path: data.csv, sheet: Data}") + ols, {"data.csv": csv(good)}, ["paper.md:9:", "sheet is only for .xlsx files"])

# Data files that are malformed in the ways downloads are.
case("header-only", fm() + ols, {"data.csv": "date,y,x\n"}, ["data.csv", "no data rows below the header"])
case("duplicate-column-names", fm() + ols, {"data.csv": "date,y,y\n2000-01,1,2\n2000-02,2,3\n"}, ["data.csv:1", 'name "y" is used by columns 2 and 3'])
case("too-many-fields", fm() + ols, {"data.csv": csv(good).replace("\n2000-03,", "\n2000-03,9,", 1)}, ["data.csv:4", "row has 4 fields but the header (line 1) has 3"])
case("unnamed-column", fm() + ols, {"data.csv": "date,y,\n2000-01,1,2\n"}, ["data.csv:1", "header: column 3 has no name"])
case("text-value", fm() + ols, {"data.csv": csv({"y": at(7, "n/a (revised)", rw(1.0)), "x": rw(0.7)})}, ["data.csv:9", "column y", 'not a number: "n/a (revised)"'])
case("decimal-comma", fm() + ols, {"data.csv": csv({"y": lambda i: rw(1.0)(i).replace(".", ","), "x": lambda i: rw(0.7)(i).replace(".", ",")}, sep=";")},
     ["data.csv:2", "column y", "not a number"])
case("invalid-month", fm() + ols, {"data.csv": csv(good, dates=monthly(5) + ["2000-13"] + monthly(20)[6:])}, ["data.csv:7", 'invalid date "2000-13"'])
case("missing-date", fm() + ols, {"data.csv": csv(good, dates=monthly(5) + [""] + monthly(20)[6:])}, ["data.csv:7", "date is missing"])
case("impossible-day", fm() + ols, {"data.csv": csv(good, dates=["2001-02-28", "2001-02-29", "2001-03-01"])}, ["data.csv:3", 'invalid date "2001-02-29"'])
case("bare-quote", fm() + ols, {"data.csv": csv(good).replace("\n2000-04,", '\n2000-04,"1', 1)}, ["data.csv:5", "malformed row"])
case("all-missing-column", fm() + ols, {"data.csv": csv({"y": lambda i: "NA", "x": rw(0.7)})}, ["paper.md:", "y"])
case("missing-drop-names-the-date", fm() + block("ols", "y: y\nx: [x]\nmissing: drop\n"), {"data.csv": csv({"y": at(30, "NA", rw(1.0)), "x": rw(0.7)})},
     ["left out (2002-07)"], exit_code=0)
case("tab-delimited", fm() + ols, {"data.csv": csv(good, sep="\t")}, ["Sample 2000-01–2004-12, N = 60."], exit_code=0)
case("undated-data", fm() + block("ols", "y: y\nx: [x]\nsample: 5..40\n"), {"data.csv": "y,x\n" + "".join(f"{rw(1.0)(i)},{rw(0.7)(i)}\n" for i in range(60))},
     ["Sample 5–40, N = 36."], exit_code=0)
case("undated-data-dated-sample", fm() + block("ols", "y: y\nx: [x]\nsample: 2000-01..\n"), {"data.csv": "y,x\n" + "".join(f"{rw(1.0)(i)},{rw(0.7)(i)}\n" for i in range(60))},
     ["paper.md:12:", "monthly but the data are undated"])
case("one-row", fm() + block("adf", "series: y\nlags: 0\n"), {"data.csv": csv(good, n=1)}, ["paper.md:", "need at least 3"])

# Manuscript-level data errors.
case("unknown-alias", fm() + "```galley ols\nid: m\ndata: dd\ny: y\nx: [x]\n```\n", {"data.csv": csv(good)}, ["paper.md:9:", 'unknown data alias "dd"', "did you mean"])
case("unknown-column", fm() + block("ols", "y: yy\nx: [x]\n"), {"data.csv": csv(good)}, ["paper.md:10:", 'no column "yy"', "did you mean y?"])
case("unclosed-expression", fm() + block("ols", "y: log(y\nx: [x]\n"), {"data.csv": csv(good)}, ["paper.md:10:", "expected \")\""])
case("sample-wrong-frequency", fm() + block("ols", "y: y\nx: [x]\nsample: 2001Q1..\n"), {"data.csv": csv(good)}, ["paper.md:12:", "quarterly but the data are monthly"])
case("sample-reversed", fm() + block("ols", "y: y\nx: [x]\nsample: 2003-01..2001-01\n"), {"data.csv": csv(good)}, ["paper.md:12:", "the start is later than the end"])
case("sample-past-the-data", fm() + block("ols", "y: y\nx: [x]\nsample: 2001-01..2009-12\n"), {"data.csv": csv(good)}, ["paper.md:12:", "ends after the data, which run from 2000-01 to 2004-12"])
case("too-few-for-ols", fm() + block("ols", "y: y\nx: [x]\nsample: 2000-01..2000-02\n"), {"data.csv": csv(good)}, ["paper.md:", "too few observations: 2 in the sample 2000-01–2000-02 for 2 coefficients"])
case("data-entry-without-path", fm("{sheet: Data}") + ols, {"data.csv": csv(good)}, ["paper.md:", "a data entry needs a path"])
case("vintage-unknown", VFRONT + "```galley revision\nid: r\nagainst: first\n```\n", vdata, ["paper.md:12:", "first"])

# A value of the wrong type is refused in words of the key, not the YAML
# decoder's ("cannot unmarshal"), and a fraction is never truncated.
adf = "```galley adf\nid: a\ndata: d\nseries: y\n"
case("lags-fraction", FRONT + adf + "lags: 1.5\n```\n", {"data.csv": csv(good)}, ["paper.md:11:", "lags takes a whole number", "not 1.5"])
case("lags-mistyped", FRONT + adf + "lags: fourr\n```\n", {"data.csv": csv(good)}, ["paper.md:11:", "lags: write a number, a selector"])
case("decimals-fraction", FRONT + adf + "decimals: 2.5\n```\n", {"data.csv": csv(good)}, ["paper.md:11:", "decimals takes a whole number", '"2.5"'])
case("decimals-word", FRONT + adf + "decimals: two\n```\n", {"data.csv": csv(good)}, ["paper.md:11:", "decimals takes a whole number", '"two"'])
case("trim-text", FRONT + "```galley za\nid: a\ndata: d\nseries: y\ntrim: abc\n```\n", {"data.csv": csv(good)}, ["paper.md:11:", "trim takes a number", '"abc"'])

# A comma inside an expression's parentheses does not split a flow list
# (YAML alone would read "lag(x" and "1)"): this manuscript builds.
case("flow-list-comma-in-expression", FRONT + "```galley ols\nid: m\ndata: d\ny: y\nx: [x, lag(x, 1)]\n```\n", {"data.csv": csv(good)}, [], exit_code=0)

# A front matter that is never closed is an error at its first line (it
# used to build, its YAML printed as the first paragraph).
case("front-matter-unclosed", "---\ntitle: Bad input\ndata:\n  d: data.csv\n\nSome text.\n", {"data.csv": csv(good)}, ["paper.md:1:", "never closed"])

# A key written twice names both lines; an id too long for a file name is
# refused when the manuscript is read (check included); an alias bomb is
# refused at the block's first line.
case("duplicate-key-names-both-lines", FRONT + adf + "lags: 1\nlags: 2\n```\n", {"data.csv": csv(good)}, ["paper.md:12:", 'mapping key "lags" already defined at line 11'])
case("id-too-long", FRONT + "```galley adf\nid: a" + "0" * 300 + "\ndata: d\nseries: y\n```\n", {"data.csv": csv(good)}, ["paper.md:8:", "at most 64 characters"])
bomb = "a: &a [x, x, x, x, x, x, x, x, x]\n" + "".join(f"{n}: &{n} [" + ", ".join([f"*{p}"] * 9) + "]\n" for p, n in zip("abcde", "bcdef"))
case("grid-alias-bomb", FRONT + "```galley grid\nid: g\nof: adf\ndata: d\nseries: y\n" + bomb + "over:\n  lags: *f\n```\n", {"data.csv": csv(good)}, ["paper.md:8:", "excessive aliasing"])

# Inline values take only formats that fit the value: no fmt error text
# ("%!s(float64=…)") in a paper, no p-value silently printed as 0.
adfok = FRONT + adf + "lags: 1\n```\n\n"
case("inline-text-verb-on-number", adfok + "The statistic is {{a.stat %s}}.\n", {"data.csv": csv(good)}, ["paper.md:", "is a number", "%s is for text"])
case("inline-d-on-fraction", adfok + "The p-value is {{a.pvalue %d}}.\n", {"data.csv": csv(good)}, ["paper.md:", "%d shows whole numbers"])
case("inline-star-width", adfok + "{{a.stat %*d}}\n", {"data.csv": csv(good)}, ["paper.md:", "is not a format"])
case("inline-argument-index", adfok + "{{a.stat %[2]d}}\n", {"data.csv": csv(good)}, ["paper.md:", "is not a format"])
case("inline-huge-width", adfok + "{{a.stat %5000d}}\n", {"data.csv": csv(good)}, ["paper.md:", "is not a format"])

# A weak-exogeneity test that names every series, or leaves fewer
# adjusting series than the rank, is refused at its line (it used to end
# in an internal error about a zero matrix dimension).
three = {"y": rw(1.0), "x": rw(0.7), "z": rw(0.3)}
jo = "```galley johansen\nid: j\ndata: d\nseries: [y, x, z]\nlags: 1\n"
case("exogeneity-every-series", FRONT + jo + "rank: 1\nexogeneity_tests: [[y, x, z]]\n```\n", {"data.csv": csv(three, n=120)}, ["paper.md:13:", "every series is named"])
case("exogeneity-below-rank", FRONT + jo + "rank: 2\nexogeneity_tests: [[y, x]]\n```\n", {"data.csv": csv(three, n=120)}, ["paper.md:13:", "exogeneity_tests at rank 2", "fewer than the rank"])
