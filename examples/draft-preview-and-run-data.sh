#!/bin/sh
# A draft recipe, its preview and a run's data through the Brothwright API, with curl.
# Needs BROTHWRIGHT_TOKEN (see README.md); BROTHWRIGHT_URL defaults to the local demo.
set -eu
URL="${BROTHWRIGHT_URL:-http://127.0.0.1:3000}"
: "${BROTHWRIGHT_TOKEN:?Set BROTHWRIGHT_TOKEN to a token made under Account → API tokens}"
HEADERS="$(mktemp)"
trap 'rm -f "$HEADERS"' EXIT

# One request: prints the body, keeps the headers in $HEADERS, stops on a refusal (problem+json).
api() {
	method="$1"
	path="$2"
	shift 2
	curl --silent --show-error --fail-with-body --dump-header "$HEADERS" \
		-X "$method" \
		-H "Authorization: Bearer $BROTHWRIGHT_TOKEN" \
		-H 'Accept: application/json' \
		"$@" "$URL$path"
}

# The first value of a text field in a JSON answer (a real integration would use jq).
field() {
	grep -o "\"$1\":\"[^\"]*\"" | head -n 1 | cut -d '"' -f 4
}

header() {
	grep -i "^$1:" "$HEADERS" | head -n 1 | cut -d ' ' -f 2- | tr -d '\r'
}

echo "== who the token acts as"
api GET /api/v1/me
echo

echo "== the components the medium uses"
for id in d-glucose sodium-chloride potassium-dihydrogen-phosphate; do
	api GET "/api/v1/components/$id" | field name
done

echo "== a new basal medium with its first draft"
name="Example basal medium $(date +%Y%m%d-%H%M%S)"
two_lines='[{"componentId": "d-glucose", "amount": 10, "unit": "g/L"},
  {"componentId": "sodium-chloride", "amount": 5, "unit": "g/L"}]'
three_lines='[{"componentId": "d-glucose", "amount": 10, "unit": "g/L"},
  {"componentId": "sodium-chloride", "amount": 5, "unit": "g/L"},
  {"componentId": "potassium-dihydrogen-phosphate", "amount": 2, "unit": "g/L"}]'
api POST /api/v1/recipes -H 'Content-Type: application/json' \
	--data "{\"name\": \"$name\", \"kind\": \"basal\", \"targetPh\": 7.0, \"lines\": $two_lines}" >/dev/null
location="$(header location | sed 's#^https\{0,1\}://[^/]*##')"
etag="$(header etag)"
echo "created $location (ETag $etag)"

echo "== the draft's lines replaced, from the revision just read"
api PUT "$location/lines" -H 'Content-Type: application/json' -H "If-Match: $etag" \
	--data "{\"lines\": $three_lines}" >/dev/null
echo "now at ETag $(header etag)"

echo "== what those lines make"
api POST /api/v1/recipes/preview -H 'Content-Type: application/json' \
	--data "{\"lines\": $three_lines}" | grep -o '"estimateMOsmPerKg":[^,}]*'

echo "== a run of the first saved study"
study="$(api GET '/api/v1/studies?limit=1' | field id)"
run="$(api POST /api/v1/runs -H 'Content-Type: application/json' \
	--data "{\"name\": \"$name\", \"studyId\": \"$study\", \"startedAt\": \"$(date -u +%Y-%m-%dT%H:%M)\"}" | field id)"
echo "run $run"

echo "== readings pushed as JSON, then as CSV, then the same JSON again (nothing changes)"
points='{"points": [{"time_h": 0, "do_percent": 98.5, "dry_weight_g_per_l": 0.21},
                    {"time_h": 0.5, "do_percent": 97.9}]}'
api POST "/api/v1/runs/$run/data" -H 'Content-Type: application/json' --data "$points"
echo
printf 'time_h,do_percent,exhaust_o2_percent\n1,96.8,20.81\n1.5,95.2,20.74\n' |
	api POST "/api/v1/runs/$run/data" -H 'Content-Type: text/csv' --data-binary @-
echo
api POST "/api/v1/runs/$run/data" -H 'Content-Type: application/json' --data "$points"
echo
echo "done"
