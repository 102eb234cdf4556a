#!/usr/bin/env bash
# Write a scene's night to CSV with curl and jq: one row per target and time step.
# Usage:  ARMILLA_URL=https://armilla.example ARMILLA_TOKEN=arm_... bash night-to-csv.sh SCENE_ID night.csv
set -euo pipefail
base="${ARMILLA_URL:-http://localhost:4321}"

curl --fail-with-body --silent --show-error \
  --header "Authorization: Bearer ${ARMILLA_TOKEN}" \
  "${base%/}/api/scenes/$1/night?step=10" |
  jq --raw-output '
    ["target", "time", "altitude", "azimuth", "airmass"],
    (.targets[] | .name as $name | .samples[] | [$name, .time, .altitude, .azimuth, .airmass])
    | @csv' > "$2"
