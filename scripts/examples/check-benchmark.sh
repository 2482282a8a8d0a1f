#!/usr/bin/env bash
# Push a calculations CSV to Lattice Ledger, wait for the benchmark revision that includes it, and pass or fail
# on the method's verdict. Exit 0: pass. Exit 1: fail. Exit 2: the import was refused, or something else went wrong.
#
#   LEDGER_URL=https://ledger.example.org LEDGER_TOKEN=llt_… BENCHMARK_ID=… METHOD_ID=… \
#   MAX_MAE=10 MIN_COVERAGE=0.5 scripts/examples/check-benchmark.sh calculations.csv
#
# Needs bash, curl (7.76 or newer, for --fail-with-body) and jq.
set -euo pipefail

file="${1:?usage: check-benchmark.sh CALCULATIONS.csv}"
: "${LEDGER_URL:?set LEDGER_URL}" "${LEDGER_TOKEN:?set LEDGER_TOKEN}" "${BENCHMARK_ID:?set BENCHMARK_ID}" "${METHOD_ID:?set METHOD_ID}"
max_mae="${MAX_MAE:?set MAX_MAE, in the unit of the benchmark, e.g. cm-1}"
min_coverage="${MIN_COVERAGE:-0}"
timeout_s="${WAIT_SECONDS:-600}"
api="${LEDGER_URL%/}/api/v1"
auth=(-H "Authorization: Bearer ${LEDGER_TOKEN}")

# GET an API path; on an error answer print its problem detail and exit 2.
api_get() {
  local out
  if ! out=$(curl -sS --fail-with-body "${auth[@]}" "${api}$1"); then
    echo "GET $1 failed: $(echo "$out" | jq -r '.detail' 2>/dev/null || echo "$out")" >&2
    exit 2
  fi
  echo "$out"
}

# 1. Push the import. The Idempotency-Key is the file's hash: a retried run of this script replays the stored
#    answer instead of importing twice (and a changed file gets a new key).
key="check-benchmark-$( (sha256sum "$file" 2>/dev/null || shasum -a 256 "$file") | cut -c1-64)"
if ! import=$(curl -sS --fail-with-body -X POST "${auth[@]}" \
  -H "Content-Type: text/csv" -H "Idempotency-Key: ${key}" \
  --data-binary @"$file" "${api}/imports?kind=calculations&fileName=$(basename "$file")"); then
  echo "import refused:" >&2
  echo "$import" | jq -r '.detail, (.errors // [] | .[] | "  row \(.row), column \(.column // "-"): \(.reason)")' >&2 || echo "$import" >&2
  exit 2
fi
import_id=$(echo "$import" | jq -r '.importId')
echo "import ${import_id}: $(echo "$import" | jq -r '"\(.insertedCount) rows in, \(.duplicateCount) duplicates"')"

# 2. Wait until the benchmark's recomputation has taken the import in.
deadline=$(( $(date +%s) + timeout_s ))
while :; do
  status=$(api_get "/benchmarks/${BENCHMARK_ID}/status?import=${import_id}")
  state=$(echo "$status" | jq -r '.state')
  if [ "$(echo "$status" | jq -r '.import.settled')" = "true" ]; then
    echo "revision $(echo "$status" | jq -r '.import.revision') includes it ($(echo "$status" | jq -r '.import.rowsInRevision') of its rows in scope)"
    break
  fi
  if [ "$state" = "failed" ]; then
    echo "recomputation failed: $(echo "$status" | jq -r '.error')" >&2
    exit 2
  fi
  if [ "$(date +%s)" -ge "$deadline" ]; then
    echo "no revision after ${timeout_s} s (state ${state})" >&2
    exit 2
  fi
  sleep 1
done

# 3. Ask for the verdict and print its numbers.
verdict=$(api_get "/benchmarks/${BENCHMARK_ID}/methods/${METHOD_ID}/verdict?maxMae=${max_mae}&minCoverage=${min_coverage}")
echo "$verdict" | jq -r '
  "\(.verdict | ascii_upcase): \(.method.label) on \(.benchmark.name), revision \(.revision.number)",
  "  MAE \(.numbers.meanAbsoluteError // "n/a") \(.unit) on N = \(.numbers.n) common pairs (max \(.thresholds.maxMae))",
  "  coverage \(.numbers.coverage // "n/a") (min \(.thresholds.minCoverage))",
  (.reasons[] | "  fail: \(.)"),
  (.warnings[] | "  note: \(.)")'
[ "$(echo "$verdict" | jq -r '.verdict')" = "pass" ]
