"""Reference instants for a star, from ERFA atco13 (IAU SOFA), for checks of the product's events,
windows and transit times. Run by hand with Debian's python3-erfa:

    /usr/bin/python3 tests/reference/stars.py > tests/reference/stars.json

Every case: ICRS place (no proper motion), site (WGS84), UT1 = UTC, no polar motion. An instant is
found by sampling every 10 min and bisecting to 0.01 s:
  - 'crossing': the observed altitude (atco13 with the refraction named) crosses a value;
  - 'transit': the observed hour angle (atco13 hob) changes sign from − to + (upper culmination).
"""
import json
import math
import sys
import warnings

import erfa

STANDARD = (1013.25, 10.0, 0.5, 0.55)
NONE = (0.0, 0.0, 0.0, 0.55)


def observed(ra, dec, site, u1, u2, cond):
    aob, zob, hob, dob, rob, eo = erfa.atco13(math.radians(ra), math.radians(dec), 0, 0, 0, 0, u1, u2, 0.0,
                                              math.radians(site['lon']), math.radians(site['lat']), site['height'],
                                              0.0, 0.0, *cond)
    return 90 - math.degrees(zob), hob


def parts(iso):
    return erfa.dtf2d('UTC', int(iso[0:4]), int(iso[5:7]), int(iso[8:10]), int(iso[11:13]), int(iso[14:16]), float(iso[17:19]))


def iso_of(u1, u2):
    y, m, d, f = erfa.d2dtf('UTC', 3, u1, u2)
    return '%04d-%02d-%02dT%02d:%02d:%02d.%03dZ' % (y, m, d, f[0], f[1], f[2], f[3])


def find(g, u1, u2, hours):
    out = []
    prev_s, prev = 0.0, g(u1, u2)
    s = 600.0
    while s <= hours * 3600:
        cur = g(u1, u2 + s / 86400)
        if (cur > 0) != (prev > 0) and abs(cur - prev) < 90:
            a, b, ga = prev_s, s, prev
            while b - a > 0.01:
                c = (a + b) / 2
                gc = g(u1, u2 + c / 86400)
                if (gc > 0) == (ga > 0):
                    a, ga = c, gc
                else:
                    b = c
            out.append({'rising': bool(cur > 0), 'time': iso_of(u1, u2 + (a + b) / 2 / 86400)})
        prev_s, prev = s, cur
        s += 600.0
    return out


CASES = [
    # tests/integration/sky-api.test.ts: POST /api/sky/windows, star α 120°, δ 0° at (0°, 0°, 0 m), floor 30° (apparent).
    dict(id='windows-equator-star', ra=120.0, dec=0.0, site=dict(lat=0.0, lon=0.0, height=0.0), start='2024-03-01T00:00:00Z',
         hours=24, kind='crossing', value=30.0, refraction='standard'),
    # tests/unit/exports/tables.test.ts: Sirius (reference-values E1) at Greenwich, next upper culmination after 22:00.
    dict(id='sirius-transit-e1', ra=(6 + 45 / 60 + 8.91728 / 3600) * 15, dec=-(16 + 42 / 60 + 58.0171 / 3600),
         site=dict(lat=51.4769, lon=0.0, height=0.0), start='2024-01-15T22:00:00Z', hours=24, kind='transit'),
    # tests/unit/sky/events.test.ts: a star (α 88.79°, δ +7.41°) rising and setting at Greenwich, h0 = −34′ geometric.
    dict(id='star-rise-set-greenwich', ra=88.79, dec=7.41, site=dict(lat=51.4769, lon=0.0, height=0.0),
         start='2024-06-01T00:00:00Z', hours=72, kind='crossing', value=-34 / 60, refraction='none'),
]


def main():
    warnings.simplefilter('ignore')
    out = []
    for c in CASES:
        u1, u2 = parts(c['start'])
        if c['kind'] == 'transit':
            g = lambda a, b: observed(c['ra'], c['dec'], c['site'], a, b, NONE)[1]  # noqa: E731
        else:
            cond = STANDARD if c['refraction'] == 'standard' else NONE
            g = lambda a, b: observed(c['ra'], c['dec'], c['site'], a, b, cond)[0] - c['value']  # noqa: E731
        found = find(g, u1, u2, c['hours'])
        if c['kind'] == 'transit':
            found = [f for f in found if f['rising']]  # hour angle − → +
        out.append({**c, 'instants': found})
    json.dump({'source': 'tests/reference/stars.py: ERFA %s atco13' % erfa.__version__, 'cases': out}, sys.stdout, indent=1)


main()
