#!/bin/sh
# Instruction counts of the solver calls (valgrind --tool=callgrind), one callgrind run per
# measurement with collection only inside the measured calls, then the table of ratios.
#
#   sh tests/benches/instructions.sh            # every measurement
#   sh tests/benches/instructions.sh bench-elbow/emitted/solve ...   # only these
#
# Needs valgrind. Counts are repeatable on a busy machine, unlike times.
set -eu
cd "$(dirname "$0")/../.."
bin=$(cargo bench -p armforge-tests --bench instructions --no-run 2>&1 \
    | sed -n 's/.*Executable .*(\(.*instructions-[0-9a-f]*\)).*/\1/p' | tail -n 1)
[ -x "$bin" ] || { echo "instructions.sh: could not build the driver" >&2; exit 1; }
out=target/callgrind
mkdir -p "$out"
counts="$out/counts.txt"
: > "$counts"
if [ "$#" -gt 0 ]; then names="$*"; else names=$("$bin" --list); fi
for name in $names; do
    file="$out/$(echo "$name" | tr '/' '_').out"
    calls=$(valgrind --tool=callgrind --toggle-collect='*instructions::measure*' \
        --callgrind-out-file="$file" "$bin" "$name" 2>/dev/null | sed -n 's/^calls [^ ]* //p')
    ir=$(sed -n 's/^summary: *//p' "$file")
    echo "$name ${ir:-0} ${calls:-1}" >> "$counts"
done
"$bin" --check
echo
"$bin" --report "$counts"
