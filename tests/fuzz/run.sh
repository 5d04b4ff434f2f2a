#!/usr/bin/env bash
# SPDX-License-Identifier: GPL-3.0-or-later
# Build the loaders' fuzz targets with clang (libFuzzer, ASan, UBSan) and run each for SECONDS
# (default 30). The corpus grows in BUILD_DIR/fuzz-corpus across runs; seeds are the demos, the
# test fixtures, the shipped parts and every input that once failed (tests/fuzz/regressions/). A crash, a hang (> 10 s on one input), a leak or a sanitizer
# report fails the run and leaves the input in BUILD_DIR/fuzz-artifacts/.
#   bash tests/fuzz/run.sh            # CI: 30 s each
#   bash tests/fuzz/run.sh 3600       # the long run: one hour each
set -euo pipefail
cd "$(dirname "$0")/../.."

seconds="${1:-30}"
build_dir="${AMPWRIGHT_FUZZ_BUILD_DIR:-build-fuzz}"
jobs="${AMPWRIGHT_JOBS:-$(nproc 2>/dev/null || echo 2)}"

cmake -S . -B "$build_dir" -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_COMPILER=clang++ \
      -DAMPWRIGHT_FUZZ=ON -DAMPWRIGHT_BUILD_UI=OFF -DAMPWRIGHT_BUILD_TESTS=OFF >/dev/null
cmake --build "$build_dir" --target fuzz_projectfile fuzz_partfile -j "$jobs"

seeds_for() {
    local d
    case "$1" in
        projectfile) for d in resources/demos tests/data/valid tests/data/broken tests/data/migrations \
                                  tests/fuzz/regressions/projectfile; do
                         [ -d "$d" ] && echo "$d"; done ;;
        partfile)    for d in parts tests/data/parts tests/fuzz/regressions/partfile; do [ -d "$d" ] && echo "$d"; done ;;
    esac
    return 0
}

mkdir -p "$build_dir/fuzz-artifacts"
for target in projectfile partfile; do
    corpus="$build_dir/fuzz-corpus/$target"
    mkdir -p "$corpus"
    mapfile -t seeds < <(seeds_for "$target")
    echo "fuzz_$target: ${seconds} s, seeds from ${seeds[*]}"
    # The first folder receives the new inputs; the seed folders are only read.
    "$build_dir/tests/fuzz/fuzz_$target" "$corpus" "${seeds[@]}" \
        -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -max_len=65536 \
        -artifact_prefix="$build_dir/fuzz-artifacts/$target-" -print_final_stats=1 2>"$build_dir/fuzz-$target.log" \
        || { tail -n 60 "$build_dir/fuzz-$target.log"; echo "fuzz_$target FAILED" >&2; exit 1; }
    grep -E "^(stat::number_of_executed_units|stat::peak_rss_mb|Done)" "$build_dir/fuzz-$target.log" || true
    echo "fuzz_$target: corpus $(ls "$corpus" | wc -l) inputs"
done
