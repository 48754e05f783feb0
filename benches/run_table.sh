#!/bin/sh
# Regenerates the table in docs/performance.md: stage times at 10^3 ... 10^6
# DOF, CLI and bare-faer wall time and peak memory, throughput rows; then the
# ignored 10^6-DOF equilibrium test. Several minutes; needs /usr/bin/time.
set -e
cd "$(dirname "$0")/.."
cargo bench --bench scale_table -- 1000 10000 100000 1000000
cargo test --release --test scale -- --ignored
