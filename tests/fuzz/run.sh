#!/usr/bin/env bash
# Runs every libFuzzer target built in BUILD_DIR (cmake -DPORECERT_FUZZ=ON, target porecert_fuzzers).
#   tests/fuzz/run.sh BUILD_DIR smoke        each target: the stored corpus, then SECONDS (default 5) s
#   tests/fuzz/run.sh BUILD_DIR runs N       each target: N executions (docs/soundness.md: N = 1000000)
# New inputs go to a scratch corpus (BUILD_DIR/fuzz-work/<reader>), never into tests/; findings are
# written to BUILD_DIR/fuzz-findings/ and make this script fail. A target is tests/fuzz/fuzz_<reader>.cpp
# with its corpus in tests/fuzz/corpus/<reader>/ (and optionally a dictionary tests/fuzz/<reader>.dict).
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
build="$1"
mode="${2:-smoke}"
arg="${3:-}"
mkdir -p "$build/fuzz-findings"
status=0
for src in "$here"/fuzz_*.cpp; do
  name="$(basename "$src" .cpp)"
  reader="${name#fuzz_}"
  exe="$build/$name"
  [ -x "$exe" ] || { echo "fuzz: $exe not built (cmake --build $build --target porecert_fuzzers)"; exit 1; }
  work="$build/fuzz-work/$reader"
  mkdir -p "$work"
  opts=(-timeout=10 -rss_limit_mb=2048 -max_len=65536 -print_final_stats=1
        "-artifact_prefix=$build/fuzz-findings/$reader-")
  [ -f "$here/$reader.dict" ] && opts+=("-dict=$here/$reader.dict")
  if [ "$mode" = smoke ]; then
    opts+=("-max_total_time=${arg:-5}" -seed=1)  # fixed seed: CI sees the same mutations each time
  else
    opts+=("-runs=${arg:-1000000}")
  fi
  echo "fuzz: $name ($mode ${arg:-})"
  if ! "$exe" "${opts[@]}" "$work" "$here/corpus/$reader" > "$build/fuzz-$reader.log" 2>&1; then
    echo "fuzz: $name FAILED; log $build/fuzz-$reader.log, inputs in $build/fuzz-findings/"
    tail -40 "$build/fuzz-$reader.log"
    status=1
  fi
  grep -E "stat::number_of_executed_units|stat::peak_rss_mb|Done [0-9]+ runs" "$build/fuzz-$reader.log" || true
done
exit $status
