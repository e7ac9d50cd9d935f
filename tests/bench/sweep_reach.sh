#!/bin/sh
# Reach of `porecert sweep` (docs/performance.md, "Sweep reach"): one line per range with boxes,
# joints, coverage, wall and CPU time and peak memory. A benchmark, not a test: it asserts nothing.
# Usage: tests/bench/sweep_reach.sh BUILD_DIR [RANGE...]   (default ranges below; minutes each)
set -u
bin="${1:-build}/porecert"
shift 2>/dev/null || true
ranges="${*:--50:50 100:110 300:305 990:1000 -60:-50 -100:-99}"
out=$(mktemp -d)
for r in $ranges; do
  for b in I; do
    /usr/bin/time -f "%e s wall, %U s CPU, %M KB" -o "$out/time" "$bin" sweep --R="$r" --branch "$b" \
      --json "$out/s.json" >"$out/log" 2>&1
    printf '%s type %s: %s | %s | %s | %s\n' "$r" "$b" "$(grep 'boxes:' "$out/log" | sed 's/^ *//')" \
      "$(grep 'joints:' "$out/log" | sed 's/^ *//')" "$(grep 'covered:' "$out/log" | sed 's/^ *//')" "$(cat "$out/time")"
    rm -f "$out/s.json" "$out/s.json.journal"
  done
done
rm -rf "$out"
