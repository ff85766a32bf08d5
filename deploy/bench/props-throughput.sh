#!/bin/sh
# Throughput of `steamtally props --given p,T`, end to end including JVM start.
#
# Writes ROWS (default 1 000 000) deterministic (p,T) rows spread over liquid, vapour and
# high-temperature states, runs the shaded jar once on them and prints rows, seconds and rows/s.
# Build the jar first:  mvn -B -q package -DskipTests
# Run from the repository root:  sh deploy/bench/props-throughput.sh [ROWS]
# Measure on an otherwise idle machine; one run is one sample.
set -eu

rows=${1:-1000000}
jar=deploy/target/steamtally.jar
[ -f "$jar" ] || { echo "no $jar; build it first with: mvn -B -q package -DskipTests" >&2; exit 2; }

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

# A fixed linear congruential sequence, so every run sees the same file: p from 1 kPa to 30 MPa,
# T from 280 K to 1000 K.
awk -v n="$rows" 'BEGIN {
    print "p,T"
    seed = 12345
    for (i = 0; i < n; i++) {
        seed = (seed * 1103515245 + 12345) % 2147483648; p = 1.0e3 + (seed / 2147483648) * 2.9999e7
        seed = (seed * 1103515245 + 12345) % 2147483648; t = 280 + (seed / 2147483648) * 720
        printf "%.6g,%.6g\n", p, t
    }
}' > "$work/in.csv"

start=$(date +%s%N)
status=0
java -jar "$jar" props --given p,T --in "$work/in.csv" --out "$work/out.csv" 2> "$work/err.txt" || status=$?
end=$(date +%s%N)

cat "$work/err.txt" >&2
out_rows=$(( $(wc -l < "$work/out.csv") - 1 ))
awk -v ns=$((end - start)) -v n="$rows" -v out="$out_rows" -v rc="$status" 'BEGIN {
    s = ns / 1e9
    printf "rows in: %d  rows out: %d  exit: %d  elapsed: %.2f s  throughput: %.0f rows/s\n", n, out, rc, s, n / s
}'
