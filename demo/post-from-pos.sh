#!/usr/bin/env bash
# What a till sends to Tallyvane at closing time: today's net sales and transaction count for its
# location. Needs TALLYVANE_TOKEN (created by the owner under "API tokens"); TALLYVANE_URL defaults
# to the local service.
set -euo pipefail
: "${TALLYVANE_TOKEN:?set TALLYVANE_TOKEN to an API token}"
url="${TALLYVANE_URL:-http://localhost:8080}"
location="${1:-HARBOUR}"
day="${2:-$(date +%F)}"
sales="${3:-1834.50}"
tickets="${4:-212}"

# One request, all or nothing; the Idempotency-Key makes a retry after a lost answer harmless.
curl -sS --fail-with-body -X POST "$url/api/v1/figures" \
  -H "Authorization: Bearer $TALLYVANE_TOKEN" \
  -H "Content-Type: application/json" \
  -H "Idempotency-Key: $location-$day" \
  -d @- <<JSON
{"figures": [
  {"location": "$location", "period": "$day", "measure": "net_sales", "amount": $sales},
  {"location": "$location", "period": "$day", "measure": "transactions", "amount": $tickets}
]}
JSON
echo

# Read the month back, rolled up from the daily figures.
curl -sS --fail-with-body "$url/api/v1/locations/$location/series?granularity=month&from=${day:0:7}-01" \
  -H "Authorization: Bearer $TALLYVANE_TOKEN"
echo
