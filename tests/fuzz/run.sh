#!/bin/bash
# Builds the libFuzzer targets (tests/fuzz/CMakeLists.txt) in build-fuzz with clang++ and runs
# each for a bounded time on a copy of its seed corpus:
#
#   bash tests/fuzz/run.sh [SECONDS] [TARGET...]   # default 60 s; every target
#
# The design target (the reader and the whole sizing, the one that finds most) runs SECONDS;
# the others (merge's reader, the atmosphere CSV reader, the argument parser: smaller inputs,
# faster) SECONDS/2 each, so CI's `run.sh 60` takes some 2.5 minutes. A long campaign locally:
# `bash tests/fuzz/run.sh 1200` (twenty minutes on the design, ten on each other target).
#
# Exits non-zero on a crash, a sanitizer report, an input that takes over 10 s (see below) or
# one that needs over 2 GB; the input is left in build-fuzz/run-TARGET/artifacts/. Reproduce
# one with `build-fuzz/TARGET FILE`, then add it to the target's corpus folder and a test (for
# the design: tests/core/design/test_fuzz_regressions.cpp).
#
# The time limit per input is wall time: 1 s fired on a loaded two-core machine for an input
# that takes 0.6 s idle (the sanitizers slow the flights tenfold). 10 s keeps a hang a failure
# without failing a slow but bounded input on a busy machine.
set -eu

seconds="${1:-60}"
shift || true
root="$(cd "$(dirname "$0")/../.." && pwd)"
build="$root/build-fuzz"
cxx="${FUZZ_CXX:-clang++}"

# Each target: its name, its seed corpus, its longest input, its dictionary (or none), and its
# share of SECONDS (in halves). One line a target.
targets=(
    "descent-sizer-fuzz corpus 8192 design.dict 2"
    "descent-sizer-fuzz-merge corpus-merge 16384 - 1"
    "descent-sizer-fuzz-csv corpus-csv 4096 - 1"
    "descent-sizer-fuzz-arguments corpus-arguments 1024 - 1"
)

if ! command -v "$cxx" >/dev/null 2>&1; then
    echo "run.sh: $cxx not found (Debian 12: apt-get install clang libclang-rt-14-dev)" >&2
    exit 2
fi

cmake -S "$root" -B "$build" -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo \
    -DCMAKE_CXX_COMPILER="$cxx" -DDESCENT_SIZER_FUZZ=ON \
    -DDESCENT_SIZER_BUILD_GUI=OFF -DDESCENT_SIZER_BUILD_TESTS=OFF >/dev/null

status=0
for line in "${targets[@]}"; do
    read -r name corpus max_len dict halves <<<"$line"
    if [ "$#" -gt 0 ] && [[ " $* " != *" $name "* ]]; then
        continue
    fi
    cmake --build "$build" --target "$name"
    # The fuzzer adds what it finds to its corpus: it works on a copy, and in a folder of its
    # own (a relative atmosphere csv_file resolves there; so does samples/, linked in).
    work="$build/run-$name"
    rm -rf "$work"
    mkdir -p "$work/corpus" "$work/artifacts"
    cp "$root/tests/fuzz/$corpus"/* "$work/corpus/"
    ln -s "$root/samples" "$work/samples"
    options=(-max_total_time="$((seconds * halves / 2))" -timeout=10 -rss_limit_mb=2048
        -max_len="$max_len" -artifact_prefix="$work/artifacts/" -print_final_stats=1)
    if [ "$dict" != "-" ]; then
        options+=(-dict="$root/tests/fuzz/$dict")
    fi
    target_status=0
    (cd "$work" && "$build/$name" corpus "${options[@]}") || target_status=$?
    if [ "$target_status" -ne 0 ]; then
        echo "run.sh: $name failed (exit $target_status); inputs:" >&2
        ls -l "$work/artifacts" >&2
        status=1
    else
        echo "run.sh: $name: no crash in $((seconds * halves / 2)) s;" \
            "$(ls "$work/corpus" | wc -l) inputs in its corpus"
    fi
done
exit "$status"
