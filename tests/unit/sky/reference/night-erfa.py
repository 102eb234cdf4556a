#!/usr/bin/python3
"""Check values for tests/unit/sky/night.test.ts, computed with ERFA (Debian python3-erfa 2.0).

Run: /usr/bin/python3 tests/unit/sky/reference/night-erfa.py
Site (stated for the test, not a real observatory): latitude +37.2, longitude -3.6 (east positive),
height 2800 m. UT1 = UTC (dut1 = 0), no polar motion, DeltaT from ERFA's leap seconds + 32.184 s.

1. Astronomical dusk on 2026-03-20: the instant the Sun's centre reaches -18 deg geometric (unrefracted)
   topocentric altitude. The Sun's ICRS direction is the geocentric one from erfa.epv00, turned into an observed place by erfa.atco13 with pressure 0 (no
   refraction); the time is found by bisection to 0.01 s.
2. Apparent altitude and azimuth of a catalogue position (RA 83.8221 deg, Dec -5.3911 deg, ICRS, no
   proper motion) at 2026-03-20T22:00:00Z with standard refraction (1013.25 hPa, 10 C, relative
   humidity 0, wavelength 0.55 um): erfa.atco13.
"""
import math
import erfa

LAT, LON, H = 37.2, -3.6, 2800.0
D2R = math.pi / 180


def utc_jd(y, mo, d, hh, mm, ss):
    return erfa.dtf2d("UTC", y, mo, d, hh, mm, ss)


def sun_icrs(u1, u2):
    t1, t2 = erfa.utctai(u1, u2)
    t1, t2 = erfa.taitt(t1, t2)
    pvh, pvb = erfa.epv00(t1, t2)
    # geocentric Sun = -(heliocentric Earth), geometric; atco13 adds annual aberration (as for a star)
    # and no diurnal parallax (the Sun's 8.8"): at this dusk that moves the instant by about 0.7 s.
    p = [-pvh[0][i] for i in range(3)]
    ra, dec = erfa.c2s(p)
    return ra % (2 * math.pi), dec


def observed_alt(u1, u2, ra, dec, phpa, tc=10.0):
    aob, zob, hob, dob, rob, eo = erfa.atco13(ra, dec, 0, 0, 0, 0, u1, u2, 0.0, LON * D2R, LAT * D2R, H, 0, 0, phpa, tc, 0.0, 0.55)
    return 90 - zob / D2R, aob / D2R


def dusk():
    u1, u2 = utc_jd(2026, 3, 20, 19, 0, 0.0)
    lo, hi = 0.0, 3600.0 * 2  # seconds after 19:00
    f = lambda s: observed_alt(u1, u2 + s / 86400.0, *sun_icrs(u1, u2 + s / 86400.0), 0.0)[0] + 18
    assert f(lo) > 0 > f(hi)
    while hi - lo > 0.01:
        m = (lo + hi) / 2
        if f(m) > 0:
            lo = m
        else:
            hi = m
    s = (lo + hi) / 2
    iy, im, iday, ihmsf = erfa.d2dtf("UTC", 3, u1, u2 + s / 86400.0)
    return "%04d-%02d-%02dT%02d:%02d:%02d.%03dZ" % (iy, im, iday, ihmsf[0], ihmsf[1], ihmsf[2], ihmsf[3])


def star():
    u1, u2 = utc_jd(2026, 3, 20, 22, 0, 0.0)
    return observed_alt(u1, u2, 83.8221 * D2R, -5.3911 * D2R, 1013.25)


print("astronomical dusk 2026-03-20:", dusk())
alt, az = star()
print("RA 83.8221 Dec -5.3911 at 2026-03-20T22:00:00Z: altitude %.6f azimuth %.6f" % (alt, az))
