#!/bin/sh
# Times galley and statsmodels on the same computations and the same
# generated data in one run, and prints the ratios (statsmodels / galley;
# above 1 means galley is faster). Installs Debian's python3-statsmodels
# if it is missing.
#
#   bench/compare.sh [RUNS]      (from anywhere inside the repository)
#
# First the whole-process targets of issue 17 (bench/cmd/procbench: the
# galley command beside statsmodels scripts, runs interleaved so that
# each ratio compares runs taken under the same load), then the
# in-process workloads (bench/cmd/galleybench beside
# bench/statsmodels_bench.py).
#
# Each figure is the best of RUNS runs (default 10); the median is shown
# too. The machine may be shared: the whole-process ratios compare runs
# taken side by side, which is what to quote. Speed is never asserted:
# this script only reports. PROCBENCH_FLAGS passes options to procbench
# (for example -py1m, or -only adf).
set -eu
RUNS=${1:-10}
ROOT=$(cd "$(dirname "$0")/.." && pwd)
cd "$ROOT"

# Debian's interpreter, where apt-get puts statsmodels (a python3 earlier
# on PATH, such as a pyenv shim, would not see it); override with PYTHON=.
PY=${PYTHON:-/usr/bin/python3}
[ -x "$PY" ] || PY=python3
if ! "$PY" -c 'import statsmodels' 2>/dev/null; then
	echo "compare.sh: installing python3-statsmodels (apt-get)" >&2
	SUDO=""
	[ "$(id -u)" -eq 0 ] || SUDO=sudo
	$SUDO apt-get install -y python3-statsmodels >&2 || { $SUDO apt-get update >&2 && $SUDO apt-get install -y python3-statsmodels >&2; }
fi

WORK=$(mktemp -d)
trap 'rm -rf "$WORK"' EXIT
go build -o "$WORK/galleybench" ./bench/cmd/galleybench
# galley as it is installed (README): a static executable
CGO_ENABLED=0 go build -o "$WORK/galley" ./cmd/galley
go build -o "$WORK/procbench" ./bench/cmd/procbench

echo "== machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ *//'), $(go version | cut -d' ' -f3-), $(date -u +%Y-%m-%d), load $(cut -d' ' -f1-3 /proc/loadavg)"
echo "== whole processes (min and median of $RUNS interleaved runs)"
"$WORK/procbench" -galley "$WORK/galley" -work "$WORK/procs" -runs "$RUNS" -demo examples/gridlink -python "$PY" ${PROCBENCH_FLAGS:-}
rm -rf "$WORK/procs"
echo
echo "== in process"
"$WORK/galleybench" -data "$WORK/data" -runs "$RUNS" -demo examples/gridlink -galley "$WORK/galley" >"$WORK/galley.tsv"
"$PY" bench/statsmodels_bench.py "$WORK/data" "$RUNS" >"$WORK/statsmodels.tsv"

awk -F'\t' '
	NR == FNR { sb[$1] = $2; sm[$1] = $3; next }
	{ g[$1] = $2; gm[$1] = $3; order[++n] = $1 }
	END {
		printf "%-24s %14s %14s %10s\n", "workload", "galley best", "statsmodels", "ratio"
		for (i = 1; i <= n; i++) {
			k = order[i]
			if (k in sb) {
				printf "%-24s %11.3f ms %11.3f ms %9.1fx\n", k, 1000 * g[k], 1000 * sb[k], sb[k] / g[k]
			} else {
				printf "%-24s %11.3f ms %14s %10s\n", k, 1000 * g[k], "-", "-"
			}
		}
		print ""
		print "(in process; the targets of issue 17 are the whole-process table above)"
	}' "$WORK/statsmodels.tsv" "$WORK/galley.tsv"
