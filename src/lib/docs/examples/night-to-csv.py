#!/usr/bin/env python3
"""Write a scene's night to CSV: one row per target and time step.

Usage:  ARMILLA_URL=https://armilla.example ARMILLA_TOKEN=arm_... python3 night-to-csv.py SCENE_ID night.csv
Standard library only. A read token is enough.
"""
import csv
import json
import os
import sys
import urllib.error
import urllib.request

base = os.environ.get("ARMILLA_URL", "http://localhost:4321").rstrip("/")
token = os.environ["ARMILLA_TOKEN"]
scene_id, out_path = sys.argv[1], sys.argv[2]

request = urllib.request.Request(
    f"{base}/api/scenes/{scene_id}/night?step=10",
    headers={"Authorization": f"Bearer {token}", "Accept": "application/json"},
)
try:
    with urllib.request.urlopen(request) as response:
        night = json.load(response)
except urllib.error.HTTPError as e:
    sys.exit(f"{e.code}: {json.load(e)['error']['message']}")

with open(out_path, "w", newline="", encoding="utf-8") as f:
    writer = csv.writer(f)
    writer.writerow(["target", "time", "altitude", "azimuth", "airmass"])
    for target in night["targets"]:
        for s in target["samples"]:
            airmass = "" if s["airmass"] is None else s["airmass"]
            writer.writerow([target["name"], s["time"], s["altitude"], s["azimuth"], airmass])

print(f"{out_path}: {len(night['targets'])} targets, {night['from']} to {night['to']}")
