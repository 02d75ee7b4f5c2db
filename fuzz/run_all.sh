#!/usr/bin/env bash
# Run every fuzz target for SECONDS each (default 40) in a temporary folder; fail on any crash.
# Seeds: the adversarial corpus and the example contracts (read only; new inputs go to the
# temporary folder). Prints libFuzzer's "Done N runs" line per target.
set -euo pipefail
cd "$(dirname "$0")/.."
SECONDS_EACH="${1:-40}"
PY="${PY:-.venv/bin/python}"
WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT
status=0
for target in text workbook contract scan; do
  mkdir -p "$WORK/$target"
  seeds=(tests/reference/adversarial/files)
  [ "$target" = contract ] && seeds=(contracts tests/reference/adversarial/files)
  [ "$target" = scan ] && seeds=(fuzz/seeds tests/reference/adversarial/files)
  echo "== fuzz_$target (${SECONDS_EACH}s)"
  if ! PYTHONPATH="fuzz${PYTHONPATH:+:$PYTHONPATH}" "$PY" "fuzz/fuzz_$target.py" \
      -max_total_time="$SECONDS_EACH" -timeout=20 -rss_limit_mb=3072 -max_len=65536 \
      -artifact_prefix="$WORK/crash-$target-" "$WORK/$target" "${seeds[@]}" \
      >"$WORK/$target.log" 2>&1; then
    status=1
    tail -n 40 "$WORK/$target.log"
    for crash in "$WORK"/crash-"$target"-*; do
      [ -f "$crash" ] && echo "crash input (base64): $(base64 -w0 "$crash" | head -c 4000)"
    done
  fi
  grep -E "^Done [0-9]+ runs" "$WORK/$target.log" || tail -n 3 "$WORK/$target.log"
done
exit "$status"
