#!/bin/sh
# Footprint of every example arm's emitted solver, f64 and f32: the bytes of a solution set
# and of one solution (printed by the no-panic check) and the code size of the emitted
# functions in that binary (x86-64, the `no-panic` profile: release, one codegen unit, fat
# LTO, runtime without `std`), from its symbol table.
#
#   sh tests/benches/footprint.sh
#
# `solve` and `solve_near` inline the shared `candidates` (every branch's steps); `solve_branch`
# and `solve_near` call one of the per-branch functions `branch_1` … `branch_N` (sizes given as their range).
set -eu
cd "$(dirname "$0")/../.."
cargo run --profile no-panic -q -p armforge-no-panic-check
bin=target/no-panic/armforge-no-panic-check
# Sizes in decimal: "SIZE NAME" per symbol.
syms=$(nm --size-sort -C "$bin" | grep 'armforge_no_panic_check::' \
    | while read -r hex _ name; do echo "$((0x$hex)) $name"; done)
size() { echo "$syms" | awk -v n="armforge_no_panic_check::$1" '$2 == n { printf "%d", $1; f = 1 } END { if (!f) printf "inlined" }'; }
echo
echo "| arm, scalar | solve | candidates | solve_near | solve_branch | branch_k | forward |"
echo "|---|---:|---:|---:|---:|---:|---:|"
for arm in bench ceiling centrifuge hotel rack gantry lid shelf hood reagent incubator tipper turner drawer dipper rail boom telescope; do
    for s in f64 f32; do
        m="${arm}_$s"
        branches=$(echo "$syms" | awk -v p="armforge_no_panic_check::$m::arm::branch_" \
            'index($2, p) == 1 { v = $1 + 0; if (!n || v < lo) lo = v; if (v > hi) hi = v; n++ }
             END { if (n) printf "%d–%d (%d)", lo, hi, n; else printf "inlined" }')
        echo "| $arm $s | $(size "$m::arm::solve") | $(size "$m::arm::candidates") | $(size "$m::arm::solve_near") | $(size "$m::arm::solve_branch") | $branches | $(size "$m::checked::forward") |"
    done
done
