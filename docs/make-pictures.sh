#!/bin/sh
# Regenerates the pictures in docs/ from the example arms.
#
#   sh docs/make-pictures.sh
#
# Needs the workspace's `armforge` binary and the developer tool tools/svg-to-png (resvg; kept
# outside the workspace so CI never builds it). Run from anywhere inside the repository.
set -eu
cd "$(dirname "$0")/.."
cargo build -q -p armforge-workbench
cargo build -q --release --manifest-path tools/svg-to-png/Cargo.toml
armforge="${CARGO_TARGET_DIR:-target}/debug/armforge"
png="tools/svg-to-png/target/release/svg-to-png"
if [ -n "${CARGO_TARGET_DIR:-}" ]; then png="$CARGO_TARGET_DIR/release/svg-to-png"; fi

# Every configuration for one tool pose of the rack loader (modified DH, metres, degrees): the
# pose is where the joint values below put the tool.
echo '{"joints": [30, -40, 110, 20, 50, 30]}' \
    | "$armforge" forward arms/rack-loader-mdh.toml > docs/rack-loader-pose.json
"$armforge" draw arms/rack-loader-mdh.toml --pose docs/rack-loader-pose.json \
    -o docs/rack-loader-solutions.svg
"$png" docs/rack-loader-solutions.svg docs/rack-loader-solutions.png 1

# One configuration of the bench elbow arm (standard DH, millimetres, degrees).
"$armforge" draw arms/bench-elbow-dh.toml --joints 30,-20,15,0,45,90 \
    -o docs/bench-elbow-drawing.svg
"$png" docs/bench-elbow-drawing.svg docs/bench-elbow-drawing.png 1
