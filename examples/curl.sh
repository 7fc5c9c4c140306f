#!/usr/bin/env bash
# One curl request for each endpoint of the lapwright HTTP service, with the answer's status.
# Start the service first (npm start, or docker run -p 8080:8080 lapwright), then:
#   bash examples/curl.sh                      # against http://127.0.0.1:8080
#   LAPWRIGHT_URL=http://127.0.0.1:9000 bash examples/curl.sh
# Writes the tracks it fetches to a temporary folder and prints where.
set -euo pipefail
BASE="${LAPWRIGHT_URL:-http://127.0.0.1:8080}"
HERE="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
OUT="$(mktemp -d)"
JSON='content-type: application/json'

# prints "<status> <what>" and the first bytes of the answer
show() {
  local what="$1"; shift
  local status
  status="$(curl -s -o "$OUT/last" -w '%{http_code}' "$@")"
  printf '%s %s\n' "$status" "$what"
  head -c 300 "$OUT/last"; printf '\n\n'
}

show "liveness" "$BASE/healthz"
show "readiness (503 until the worker pool is up)" "$BASE/readyz"
show "the difficulty presets" "$BASE/v1/presets"

# one track with every default; the seed is drawn at random and echoed in the track
show "a track with the defaults" -X POST "$BASE/v1/tracks" -H "$JSON" -d '{}'

# a held-out evaluation track from a request file; keep the ETag for a conditional request
curl -s -X POST "$BASE/v1/tracks" -H "$JSON" --data @"$HERE/requests/heldout-eval.json" -D "$OUT/headers" -o "$OUT/heldout.json"
ETAG="$(grep -i '^etag:' "$OUT/headers" | cut -d' ' -f2 | tr -d '\r')"
echo "saved $OUT/heldout.json (ETag $ETAG)"
show "the same request with If-None-Match (304, no body)" -X POST "$BASE/v1/tracks" -H "$JSON" -H "If-None-Match: $ETAG" --data @"$HERE/requests/heldout-eval.json"

# the cacheable form: seed in the path, nested parameters flattened with a dot
show "GET by seed, cacheable forever" "$BASE/v1/tracks/larkspur-heldout-0042?lengthM=3000&widthM.min=9&widthM.max=12&curvatureBudgetDeg=1500&turnBalance=0.4&cornerCount=15&minCornerRadiusM=14&noise=0.35&gateSpacingM.min=4&gateSpacingM.max=20"

# check a track (one a designer edited by hand, say): 200 {valid, issues}
show "validate a track" -X POST "$BASE/v1/tracks/validate" -H "$JSON" --data @"$OUT/heldout.json"

# the answers that say what to change
show "400: every bad field with its path" -X POST "$BASE/v1/tracks" -H "$JSON" -d '{"lengthM": 50, "widthM": {"min": 12, "max": 8}, "laps": 3}'
show "422: infeasible, with reason and hint" -X POST "$BASE/v1/tracks" -H "$JSON" --data @"$HERE/requests/one-way-too-much-turning.json"
show "406: the Accept header allows no format" -X POST "$BASE/v1/tracks" -H "$JSON" -H 'Accept: text/html' -d '{}'

# the same held-out track for a simulator (glb), for people (svg) and for a notebook (csv)
curl -s -o "$OUT/heldout-0042.glb" -w '%{http_code} the held-out track as glb (3D scene)\n' "$BASE/v1/tracks/larkspur-heldout-0042?lengthM=3000&format=glb"
show "the same track as a drawing with the road coloured by curvature" "$BASE/v1/tracks/larkspur-heldout-0042?lengthM=3000&format=svg&heat=true"
show "its gates as CSV" "$BASE/v1/tracks/larkspur-heldout-0042?lengthM=3000&format=csv&table=gates"
show "the track format's JSON Schema" "$BASE/v1/schema/track"

show "the OpenAPI document (interactive documentation at $BASE/docs)" "$BASE/openapi.json"
echo "preview page: $BASE/"
echo "tracks saved in $OUT"
