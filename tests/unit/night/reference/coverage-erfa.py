#!/usr/bin/python3
"""Check values for tests/unit/night/coverage-geometry.test.ts, computed with ERFA (Debian python3-erfa).

Run: /usr/bin/python3 tests/unit/night/reference/coverage-erfa.py > tests/unit/night/reference/coverage-erfa.json
Site (stated for the test, not a real observatory): latitude -30.25, longitude -70.74 (east positive),
height 2200 m. UT1 = UTC (dut1 = 0), no polar motion. Refraction for 1013.25 hPa, 10 C, relative
humidity 0.5, wavelength 0.55 um (the product's 'standard' conditions).

- A star (RA 252.0 deg, Dec -34.0 deg, ICRS, no proper motion): erfa.atco13 at each instant.
- The Sun: geocentric = -(heliocentric Earth) from erfa.epv00, less the observer's geocentric
  position (from erfa.apco13's astrom: eb minus the Earth's barycentric position), then
  erfa.atciqz (light deflection, aberration, to CIRS) and erfa.atioq (to observed az/zd).
- The Moon: geocentric from erfa.moon98, less the observer's geocentric position, then the same.
"""
import json
import math
import erfa

LAT, LON, H = -30.25, -70.74, 2200.0
D2R = math.pi / 180
PHPA, TC, RH, WL = 1013.25, 10.0, 0.5, 0.55


def jd(iso):
    d, t = iso.rstrip("Z").split("T")
    y, mo, dd = (int(x) for x in d.split("-"))
    hh, mm, ss = t.split(":")
    return erfa.dtf2d("UTC", y, mo, dd, int(hh), int(mm), float(ss))


def tt(u1, u2):
    t1, t2 = erfa.utctai(u1, u2)
    return erfa.taitt(t1, t2)


def star(iso, ra_deg, dec_deg):
    u1, u2 = jd(iso)
    aob, zob, hob, dob, rob, eo = erfa.atco13(ra_deg * D2R, dec_deg * D2R, 0, 0, 0, 0, u1, u2, 0.0, LON * D2R, LAT * D2R, H, 0, 0, PHPA, TC, RH, WL)
    return {"azimuth": (aob / D2R) % 360, "altitude": 90 - zob / D2R}


def observed_body(iso, geo_au):
    u1, u2 = jd(iso)
    astrom, eo = erfa.apco13(u1, u2, 0.0, LON * D2R, LAT * D2R, H, 0, 0, PHPA, TC, RH, WL)
    t1, t2 = tt(u1, u2)
    pvh, pvb = erfa.epv00(t1, t2)
    obs_geo = [astrom["eb"][i] - pvb[0][i] for i in range(3)]
    p = [geo_au[i] - obs_geo[i] for i in range(3)]
    ra, dec = erfa.c2s(p)
    ri, di = erfa.atciqz(ra % (2 * math.pi), dec, astrom)
    aob, zob, hob, dob, rob = erfa.atioq(ri, di, astrom)
    return {"azimuth": (aob / D2R) % 360, "altitude": 90 - zob / D2R}


def sun(iso):
    t1, t2 = tt(*jd(iso))
    pvh, pvb = erfa.epv00(t1, t2)
    return observed_body(iso, [-pvh[0][i] for i in range(3)])


def moon(iso):
    t1, t2 = tt(*jd(iso))
    pv = erfa.moon98(t1, t2)
    return observed_body(iso, [pv[0][i] for i in range(3)])


STAR_TIMES = ["2026-06-10T23:00:00Z", "2026-06-11T02:30:00Z", "2026-06-11T05:00:00Z"]
CURSOR = "2026-06-11T15:00:00Z"
out = {
    "script": "tests/unit/night/reference/coverage-erfa.py",
    "erfa": erfa.__version__,
    "site": {"lat": LAT, "lon": LON, "height": H},
    "star": {"ra": 252.0, "dec": -34.0, "track": [dict(time=t, **star(t, 252.0, -34.0)) for t in STAR_TIMES]},
    "cursor": CURSOR,
    "sun": sun(CURSOR),
    "moon": moon(CURSOR),
}
print(json.dumps(out, indent=2))
