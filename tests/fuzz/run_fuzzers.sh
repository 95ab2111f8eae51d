#!/usr/bin/env bash
# Opt-in fuzzing with libFuzzer (needs clang and its libFuzzer runtime; Debian: clang).
#
#   tests/fuzz/run_fuzzers.sh [SECONDS] [TARGET...]     # default: 600 s each, every target
#   tests/fuzz/run_fuzzers.sh 900 csv_model             # one target for 15 minutes
#
# Builds the fuzz targets with clang -fsanitize=fuzzer,address,undefined into
# build-fuzz/ (TL_FUZZ_BUILD_DIR to change it), then runs each in turn for SECONDS on a
# working corpus (build-fuzz/fuzz-corpus/<target>, seeded from tests/fuzz/corpus) and
# prints libFuzzer's final statistics. A crash, leak, sanitizer report, timeout (10 s)
# or excess memory (2 GiB) leaves its input in build-fuzz/fuzz-findings/<target>/ and
# makes this script exit 1. Keep each one fixed input as tests/fuzz/regressions/<target>/
# so that ctest replays it (DEVELOPERS.md, "Fuzzing and sanitizers").
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
SECONDS_EACH="${1:-600}"
shift || true
TARGETS=("$@")
[ ${#TARGETS[@]} -eq 0 ] && TARGETS=(csv_model scor project survey)
BUILD="${TL_FUZZ_BUILD_DIR:-$ROOT/build-fuzz}"

command -v clang++ >/dev/null || { echo "run_fuzzers.sh needs clang++ (Debian package clang)" >&2; exit 2; }
launcher=()
command -v ccache >/dev/null && launcher=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache)
sanitizers="address,undefined"
cmake -S "$ROOT" -B "$BUILD" -G Ninja "${launcher[@]}" \
  -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=Debug \
  -DTL_BUILD_GUI=OFF -DTL_BUILD_TESTS=ON -DTL_BUILD_BENCHMARKS=OFF -DTL_FUZZ=ON \
  "-DCMAKE_CXX_FLAGS=-O1 -g -fno-omit-frame-pointer -fsanitize=fuzzer-no-link,$sanitizers -fno-sanitize-recover=undefined" \
  "-DCMAKE_EXE_LINKER_FLAGS=-fsanitize=$sanitizers" >/dev/null
cmake --build "$BUILD" --parallel "$(nproc)" --target "${TARGETS[@]/#/fuzz_}"

status=0
for t in "${TARGETS[@]}"; do
  work="$BUILD/fuzz-corpus/$t"
  findings="$BUILD/fuzz-findings/$t"
  mkdir -p "$work" "$findings"
  dict=()
  [ -f "$ROOT/tests/fuzz/$t.dict" ] && dict=("-dict=$ROOT/tests/fuzz/$t.dict")
  echo "== fuzz_$t for $SECONDS_EACH s (corpus $work, findings $findings)"
  # New inputs go to the first folder (the working corpus); the committed seeds are read only.
  if ! ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 \
      "$BUILD/tests/fuzz/fuzz_$t" "$work" "$ROOT/tests/fuzz/corpus/$t" "${dict[@]}" \
      -max_total_time="$SECONDS_EACH" -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
      -artifact_prefix="$findings/" 2>&1 | tee "$BUILD/fuzz-$t.log" | grep -E '^(#|==|stat::|SUMMARY|INFO: Seed|Done)' | tail -n 25; then
    :
  fi
  if ls "$findings" | grep -q .; then
    echo "!! fuzz_$t found $(ls "$findings" | wc -l) input(s): $findings" >&2
    status=1
  fi
done
exit $status
