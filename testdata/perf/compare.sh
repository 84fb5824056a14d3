#!/bin/sh
# Compares scaleplan with a vectorised numpy reference on the synthetic study
# of the README's performance figures, from a clean clone:
#
#   testdata/perf/compare.sh            # 2000x100x40x4: 32 million points
#   SIZE=2000x200x40x4 testdata/perf/compare.sh   # twice the second axis
#
# 1. builds scaleplan and writes the study (scaleplan init DIR --synthetic
#    SIZE, CSV sheets);
# 2. exports every combination's limits and log-linear forms for the
#    reference (the Go test helper TestWriteReferenceTerms; see the header of
#    reference.py for why the reference starts from that export);
# 3. runs, alternating the two programs ROUNDS times (default 2): the sweep
#    alone (scaleplan run --no-files --json; reference.py printing its
#    windows) and end to end (scaleplan run writing its workbook, maps and
#    memo; reference.py writing the map sheets with openpyxl's write-only
#    mode), each under /usr/bin/time -v;
# 4. checks that the windows agree (reference.py check) and prints the best
#    wall time, the CPU time (user + system) and the peak memory of each, side
#    by side, with the ratios numpy / scaleplan (above 1: scaleplan is faster
#    or smaller).
#
# numpy and openpyxl come from the system's packages (Debian python3-numpy,
# python3-openpyxl), installed with apt-get when missing; /usr/bin/python3 is
# used on purpose (a python3 earlier on PATH may lack them). Needs go, and
# root or sudo for apt-get. Times on a shared machine are noisy: run it on an
# idle one, and prefer the CPU times.
set -eu

SIZE=${SIZE:-2000x100x40x4}
ROUNDS=${ROUNDS:-2}
PY=/usr/bin/python3
ROOT=$(cd "$(dirname "$0")/../.." && pwd)
WORK=${WORK:-$(mktemp -d "${TMPDIR:-/tmp}/scaleplan-perf.XXXXXX")}

need() { # module package
	if ! "$PY" -c "import $1" 2>/dev/null; then
		SUDO=""
		[ "$(id -u)" = 0 ] || SUDO=sudo
		$SUDO apt-get install -y "$2" >/dev/null || { $SUDO apt-get update >/dev/null && $SUDO apt-get install -y "$2" >/dev/null; }
	fi
}
need numpy python3-numpy
need openpyxl python3-openpyxl

cd "$ROOT"
echo "work folder: $WORK"
go build -o "$WORK/scaleplan" ./cmd/scaleplan
rm -rf "$WORK/study" "$WORK/out"
"$WORK/scaleplan" init "$WORK/study" --synthetic "$SIZE" >/dev/null
SCALEPLAN_REFERENCE_STUDY="$WORK/study" SCALEPLAN_REFERENCE_OUT="$WORK/terms.json" \
	go test ./sweep -run '^TestWriteReferenceTerms$' -count=1 >/dev/null

# measure NAME COMMAND...: runs the command under /usr/bin/time -v and keeps
# the best wall time, the CPU time of that run and the largest peak memory.
measure() {
	name=$1
	shift
	/usr/bin/time -v -o "$WORK/time.txt" "$@" >"$WORK/$name.stdout"
	awk -v name="$name" '
		/Elapsed \(wall clock\)/ { n = split($NF, p, ":"); w = 0; for (i = 1; i <= n; i++) w = w * 60 + p[i] }
		/User time/ { u = $NF } /System time/ { s = $NF }
		/Maximum resident set size/ { m = $NF / 1024 }
		END { printf "%s %.3f %.3f %.1f\n", name, w, u + s, m }' "$WORK/time.txt" >>"$WORK/times.txt"
}

: >"$WORK/times.txt"
r=1
while [ "$r" -le "$ROUNDS" ]; do
	measure sweep-scaleplan "$WORK/scaleplan" run "$WORK/study" --no-files --json
	measure sweep-numpy "$PY" testdata/perf/reference.py "$WORK/terms.json"
	rm -rf "$WORK/out"
	measure e2e-scaleplan "$WORK/scaleplan" run "$WORK/study" --out "$WORK/out"
	measure e2e-numpy "$PY" testdata/perf/reference.py "$WORK/terms.json" --workbook "$WORK/reference-maps.xlsx"
	r=$((r + 1))
done

echo "study: scaleplan init --synthetic $SIZE; $ROUNDS rounds, alternating; $(nproc) cores"
"$PY" testdata/perf/reference.py check "$WORK/terms.json" "$WORK/sweep-numpy.stdout" "$WORK/sweep-scaleplan.stdout"

awk '
	{ w[$1] = (w[$1] == "" || $2 < w[$1]) ? $2 : w[$1]; if ($2 <= w[$1]) c[$1] = $3; m[$1] = (m[$1] > $4) ? m[$1] : $4 }
	END {
		printf "%-12s %-14s %10s %10s %10s\n", "", "", "scaleplan", "numpy", "ratio"
		split("sweep e2e", k, " ")
		split("sweep alone|end to end", label, "|")
		for (i = 1; i <= 2; i++) {
			s = k[i] "-scaleplan"; n = k[i] "-numpy"
			printf "%-12s %-14s %10.2f %10.2f %10.2f\n", label[i], "wall s (best)", w[s], w[n], w[n] / w[s]
			printf "%-12s %-14s %10.2f %10.2f %10.2f\n", "", "CPU s", c[s], c[n], c[n] / c[s]
			printf "%-12s %-14s %10.0f %10.0f %10.2f\n", "", "peak MiB", m[s], m[n], m[n] / m[s]
		}
	}' "$WORK/times.txt"
