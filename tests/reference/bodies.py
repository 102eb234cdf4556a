"""Reference apparent places and events of the Sun, Moon and planets, from JPL DE405 (read by
de405.py) and the IAU SOFA chain as ERFA implements it (Debian python3-erfa). Run by hand:

    /usr/bin/python3 tests/reference/bodies.py > tests/reference/bodies.json

Topocentric place of a body at UTC t for a site (WGS84), UT1 − UTC = dut1, polar motion xp, yp:
  astrom = eraApco13(...)                              (observer's barycentric position/velocity, BPN, ERA, refraction A/B)
  observer = DE405 Earth(TDB) + (astrom.eb − eraEpv00 Earth)   (the site's geocentric offset, on DE405's Earth)
  light time: body(TDB − τ) − observer(TDB), τ = |…| / c, iterated
  eraLd (the Sun's deflection, finite distance; not for the Sun itself), eraAb (aberration, observer's total velocity)
  → GCRS proper direction; bpn → CIRS; eraAtioq → azimuth, zenith distance (refraction by astrom's A, B).
Geocentric apparent places (true equator and equinox of date) use the geocentre as observer and
eraPnm06a (IAU 2006/2000A) for the rotation.
Events: the instant the topocentric geometric altitude of the body's centre crosses h0 (the product's
stated conventions: Sun −50′, twilights −6°, −12°, −18°, Moon −34′ − topocentric semidiameter),
by bisection to 0.01 s. No part of the product is used.
"""
import json
import math
import sys

import warnings

import erfa
import numpy as np

import de405

C_AU_DAY = de405.C_KMS * 86400 / de405.AU_KM
AU = de405.AU_KM
MOON_RADIUS_KM = 1737.4
ARCSEC = math.pi / 180 / 3600

SITES = {
    'greenwich': dict(lat=51.4769, lon=0.0, height=0.0),
    'south': dict(lat=-30.2446, lon=-70.7494, height=2200.0),
    'high': dict(lat=19.8207, lon=-155.4681, height=4207.0),
}
# Sites only used for the day-length events (events.test.ts).
DAY_SITES = {
    'lat40': dict(lat=40.0, lon=0.0, height=0.0),
    'equator': dict(lat=0.0, lon=0.0, height=0.0),
}
DAY_CASES = [('lat40', '2024-06-20T00:00:00Z'), ('equator', '2024-03-20T00:00:00Z')]
STANDARD = dict(phpa=1013.25, tc=10.0, rh=0.5, wl=0.55)


def utc_parts(iso):
    y, mo, d = int(iso[0:4]), int(iso[5:7]), int(iso[8:10])
    hh, mm, ss = int(iso[11:13]), int(iso[14:16]), float(iso[17:19] + (iso[19:iso.index('Z')] if '.' in iso else ''))
    return erfa.dtf2d('UTC', y, mo, d, hh, mm, ss)


def tdb_of(u1, u2):
    a1, a2 = erfa.utctai(u1, u2)
    t1, t2 = erfa.taitt(a1, a2)
    return t1 + t2 + 0.0  # TDB − TT (< 2 ms) is below what matters here


def body_place(body, u1, u2, site, refr=False, dut1=0.0, xp=0.0, yp=0.0, geocentric=False):
    """Returns dict: az, alt (degrees, observed), distance_km, and the GCRS proper direction."""
    cond = STANDARD if refr else dict(phpa=0.0, tc=0.0, rh=0.0, wl=0.55)
    astrom, eo = erfa.apco13(u1, u2, dut1, site['lon'] * math.pi / 180, site['lat'] * math.pi / 180, site['height'],
                             xp * ARCSEC, yp * ARCSEC, cond['phpa'], cond['tc'], cond['rh'], cond['wl'])
    jd = tdb_of(u1, u2)
    _, pvb = erfa.epv00(jd, 0.0)
    earth = de405.barycentric_km('earth', jd) / AU
    offset = np.zeros(3) if geocentric else (astrom['eb'] - pvb['p'])
    obs = earth + offset
    sun = de405.barycentric_km('sun', jd) / AU
    tau = 0.0
    for _ in range(6):
        pos = de405.barycentric_km(body, jd - tau) / AU
        d = pos - obs
        tau = np.linalg.norm(d) / C_AU_DAY
    dist = np.linalg.norm(d)
    p = d / dist
    if geocentric:
        v = (de405.barycentric_velocity_kms('earth', jd) / de405.C_KMS)
        bm1 = math.sqrt(1 - v @ v)
        e_vec = obs - sun
    else:
        v = astrom['v']
        bm1 = astrom['bm1']
        e_vec = obs - sun
    em = np.linalg.norm(e_vec)
    e = e_vec / em
    if body != 'sun':
        sun_then = de405.barycentric_km('sun', jd - tau) / AU
        q = pos - sun_then
        q = q / np.linalg.norm(q)
        p = erfa.ld(1.0, p, q, e, em, 1e-9)
    ppr = erfa.ab(p, v, em, bm1)
    out = {'distance_km': dist * AU}
    if geocentric:
        npb = erfa.pnm06a(jd, 0.0)
        w = npb @ ppr
        out['ra'] = (math.degrees(math.atan2(w[1], w[0])) + 360) % 360
        out['dec'] = math.degrees(math.asin(w[2]))
        return out
    ci = astrom['bpn'] @ ppr
    ri, di = erfa.c2s(ci)
    aob, zob, hob, dob, rob = erfa.atioq(ri, di, astrom)
    out['az'] = math.degrees(aob) % 360
    out['alt'] = 90 - math.degrees(zob)
    return out


def iso_of(u1, u2):
    y, m, d, f = erfa.d2dtf('UTC', 3, u1, u2)
    return '%04d-%02d-%02dT%02d:%02d:%02d.%03dZ' % (y, m, d, f[0], f[1], f[2], f[3])


def add_seconds(u1, u2, s):
    return u1, u2 + s / 86400.0


EVENT_H0 = {
    'sun': [('rise/set', -50 / 60), ('civil', -6.0), ('nautical', -12.0), ('astronomical', -18.0)],
    'moon': [('rise/set', None)],
}


def altitude_minus_h0(body, u1, u2, site, h0):
    pl = body_place(body, u1, u2, site)
    if h0 is None:  # Moon: −34′ − topocentric semidiameter
        h0 = -34 / 60 - math.degrees(math.asin(MOON_RADIUS_KM / pl['distance_km']))
    return pl['alt'] - h0


def events(body, site, start_iso, hours):
    u1, u2 = utc_parts(start_iso)
    out = []
    for name, h0 in EVENT_H0[body]:
        step = 600.0
        prev_s, prev_g = 0.0, altitude_minus_h0(body, u1, u2, site, h0)
        s = step
        while s <= hours * 3600:
            g = altitude_minus_h0(body, u1, u2 + s / 86400, site, h0)
            if (g > 0) != (prev_g > 0):
                a, b, ga = prev_s, s, prev_g
                while b - a > 0.01:
                    c = (a + b) / 2
                    gc = altitude_minus_h0(body, u1, u2 + c / 86400, site, h0)
                    if (gc > 0) == (ga > 0):
                        a, ga = c, gc
                    else:
                        b = c
                t = (a + b) / 2
                rising = g > 0
                kind = {'rise/set': 'rise' if rising else 'set', 'civil': 'civil-dawn' if rising else 'civil-dusk',
                        'nautical': 'nautical-dawn' if rising else 'nautical-dusk',
                        'astronomical': 'astronomical-dawn' if rising else 'astronomical-dusk'}[name]
                out.append({'kind': kind, 'time': iso_of(u1, u2 + t / 86400)})
            prev_s, prev_g = s, g
            s += step
    out.sort(key=lambda e: e['time'])
    return out


BODIES = ['sun', 'moon', 'mercury', 'venus', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune']
TOPO_DATES = ['2003-08-27T20:00:00Z', '2012-06-05T23:30:00Z', '2024-01-15T22:00:00Z', '2026-12-03T04:00:00Z',
              '2028-03-21T12:00:00Z', '2029-09-09T16:45:00Z']
# Dates between 2000 and 2030 for the geocentric check of the Sun and planets (a fixed pseudo-random draw).
# Not beyond 2030: there the product's ΔT model leaves TT − UTC = 69.184 s (ERFA keeps it), so the instants
# would no longer be the same (a few seconds, up to 0.7″ for a fast inner planet).
rng = np.random.default_rng(16)
GEO_JD = sorted(float(x) for x in rng.uniform(2451545.0, 2462502.5, 24))
EVENT_DAYS = ['2024-03-20T00:00:00Z', '2024-06-21T00:00:00Z', '2026-12-03T00:00:00Z']


def main():
    warnings.simplefilter('ignore')  # ERFA's 'dubious year' notes for dates after its leap-second table
    topo = []
    for sname, site in SITES.items():
        for iso in TOPO_DATES:
            u1, u2 = utc_parts(iso)
            for b in BODIES:
                a = body_place(b, u1, u2, site)
                r = body_place(b, u1, u2, site, refr=True)
                topo.append({'site': sname, 'time': iso, 'body': b, 'az': round(a['az'], 8), 'alt': round(a['alt'], 8),
                             'altStandard': round(r['alt'], 8), 'distanceKm': round(a['distance_km'], 3)})
    geo = []
    for jd in GEO_JD:
        y, m, d, fd = erfa.jd2cal(jd, 0.0)
        t1, t2 = erfa.dtf2d('UTC', y, m, d, int(fd * 24), int(fd * 1440) % 60, 0.0)
        iso = iso_of(t1, t2)
        for b in BODIES:
            if b == 'moon':
                continue
            g = body_place(b, t1, t2, SITES['greenwich'], geocentric=True)
            geo.append({'time': iso, 'body': b, 'ra': round(g['ra'], 9), 'dec': round(g['dec'], 9), 'distanceKm': round(g['distance_km'], 1)})
    ev = []
    for sname, site in SITES.items():
        for day in EVENT_DAYS:
            for b in ('sun', 'moon'):
                ev.append({'site': sname, 'from': day, 'hours': 48, 'body': b, 'events': events(b, site, day, 48)})
    for sname, day in DAY_CASES:
        ev.append({'site': sname, 'from': day, 'hours': 24, 'body': 'sun', 'events': events('sun', DAY_SITES[sname], day, 24)})
    json.dump({
        'source': 'tests/reference/bodies.py: JPL DE405 (casacore-data-jpl-de405) + ERFA ' + erfa.__version__ + ' (apco13, ld, ab, atioq, pnm06a)',
        'sites': {**SITES, **DAY_SITES}, 'standardRefraction': STANDARD, 'topocentric': topo, 'geocentric': geo, 'events': ev,
    }, sys.stdout, indent=1)


if __name__ == '__main__':
    main()
