#!/bin/bash
# Builds the libFuzzer target (tests/fuzz/fuzz_size.cpp) in build-fuzz with clang++ and runs it
# for a bounded time on a copy of the seed corpus.
#
#   bash tests/fuzz/run.sh [SECONDS]      # default 60
#
# Exits non-zero on a crash, a sanitizer report, an input that takes over 1 s or one that needs
# over 2 GB; the input is left in build-fuzz/run/artifacts/. Reproduce one with
# `build-fuzz/descent-sizer-fuzz FILE`, then add it to tests/fuzz/corpus/ and to
# tests/core/design/test_fuzz_regressions.cpp.
set -eu

seconds="${1:-60}"
root="$(cd "$(dirname "$0")/../.." && pwd)"
build="$root/build-fuzz"
cxx="${FUZZ_CXX:-clang++}"

if ! command -v "$cxx" >/dev/null 2>&1; then
    echo "run.sh: $cxx not found (Debian 12: apt-get install clang libclang-rt-14-dev)" >&2
    exit 2
fi

cmake -S "$root" -B "$build" -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo \
    -DCMAKE_CXX_COMPILER="$cxx" -DDESCENT_SIZER_FUZZ=ON \
    -DDESCENT_SIZER_BUILD_GUI=OFF -DDESCENT_SIZER_BUILD_TESTS=OFF >/dev/null
cmake --build "$build" --target descent-sizer-fuzz

# The fuzzer adds what it finds to its corpus: it works on a copy, and in a folder of its own
# (a relative atmosphere csv_file resolves there).
work="$build/run"
rm -rf "$work"
mkdir -p "$work/corpus" "$work/artifacts"
cp "$root"/tests/fuzz/corpus/* "$work/corpus/"
cd "$work"

status=0
"$build/descent-sizer-fuzz" corpus \
    -max_total_time="$seconds" -timeout=1 -rss_limit_mb=2048 -max_len=8192 \
    -dict="$root/tests/fuzz/design.dict" -artifact_prefix="$work/artifacts/" \
    -print_final_stats=1 || status=$?

if [ "$status" -ne 0 ]; then
    echo "run.sh: the fuzzer failed (exit $status); inputs:" >&2
    ls -l "$work/artifacts" >&2
    exit 1
fi
echo "run.sh: no crash in ${seconds} s; $(ls corpus | wc -l) inputs in the corpus"
