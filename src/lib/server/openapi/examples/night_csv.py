#!/usr/bin/env python3
"""Pull a scene's night numbers from Armilla and write them to a CSV file (standard library only).

Usage:  ARMILLA_TOKEN=arm_... python3 night_csv.py SCENE_ID [OUT.csv]
        ARMILLA_URL defaults to http://127.0.0.1:4321
"""
import csv
import json
import os
import sys
import urllib.error
import urllib.request
from datetime import datetime

BASE = os.environ.get("ARMILLA_URL", "http://127.0.0.1:4321").rstrip("/")
TOKEN = os.environ["ARMILLA_TOKEN"]  # a read token made on your account page
scene_id = sys.argv[1]
out_path = sys.argv[2] if len(sys.argv) > 2 else f"night-{scene_id}.csv"


def when(iso):
    """ISO 8601 UTC ('...Z') to an aware datetime (Python 3.7+)."""
    return datetime.fromisoformat(iso.replace("Z", "+00:00"))


request = urllib.request.Request(
    f"{BASE}/api/scenes/{scene_id}/night?step=10",
    headers={"Authorization": f"Bearer {TOKEN}", "Accept": "application/json"},
)
try:
    with urllib.request.urlopen(request) as response:
        night = json.load(response)
except urllib.error.HTTPError as e:
    sys.exit(f"{e.code}: {json.load(e)['error']['message']}")

with open(out_path, "w", newline="") as f:
    out = csv.writer(f)
    out.writerow(["target", "time_utc", "altitude_deg", "azimuth_deg", "airmass", "in_window"])
    for target in night["targets"]:
        windows = [(when(w["start"]), when(w["end"])) for w in target["windows"]]
        for s in target["samples"]:
            t = when(s["time"])
            inside = any(start <= t <= end for start, end in windows)
            airmass = "" if s["airmass"] is None else f"{s['airmass']:.3f}"
            out.writerow([target["name"], s["time"], f"{s['altitude']:.3f}", f"{s['azimuth']:.3f}", airmass, inside])

print(f"{out_path}: {sum(len(t['samples']) for t in night['targets'])} rows, night {night['from']} to {night['to']}")
