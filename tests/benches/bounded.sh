#!/bin/sh
# Bounded time: instructions of every single call of solve, solve_branch and solve_near, every
# example arm, f64 and f32, over random, near-singular, reach-boundary, unreachable and NaN
# poses (valgrind --tool=callgrind, collection only inside each call, one dump per call), then
# the median and the worst per arm, call and scalar (target: worst ≤ 1.3 × median).
#
#   sh tests/benches/bounded.sh
#
# Needs valgrind. Counts are repeatable on a busy machine, unlike times. The same build and
# callgrind options as tests/benches/instructions.sh.
set -eu
cd "$(dirname "$0")/../.."
bin=$(cargo bench -p armforge-tests --bench bounded --no-run 2>&1 \
    | sed -n 's/.*Executable .*(\(.*bounded-[0-9a-f]*\)).*/\1/p' | tail -n 1)
[ -x "$bin" ] || { echo "bounded.sh: could not build the driver" >&2; exit 1; }
out=target/callgrind/bounded
rm -rf "$out"
mkdir -p "$out"
"$bin" --list > "$out/labels.txt"
valgrind --tool=callgrind --toggle-collect='*bounded::measure_one*' \
    --dump-after='bounded::measure_one' \
    --callgrind-out-file="$out/cg.out" "$bin" --run 2>/dev/null >/dev/null
# One dump per call, numbered in call order: cg.out.1, cg.out.2, ...
n=$(wc -l < "$out/labels.txt")
i=1
: > "$out/counts.txt"
while read -r label; do
    [ -f "$out/cg.out.$i" ] || { echo "bounded.sh: no dump for call $i ($label)" >&2; exit 1; }
    ir=$(sed -n 's/^summary: *//p;s/^totals: *//p' "$out/cg.out.$i" | head -n 1)
    echo "$label ${ir:-nan}" >> "$out/counts.txt"
    i=$((i + 1))
done < "$out/labels.txt"
[ "$((i - 1))" -eq "$n" ] || { echo "bounded.sh: $n labels, $((i - 1)) dumps" >&2; exit 1; }
rm -f "$out"/cg.out*
"$bin" --report "$out/counts.txt"
