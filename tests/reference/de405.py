"""Reads JPL DE405 as Debian's casacore-data-jpl-de405 ships it (a casacore table of the
Chebyshev records, 1018 doubles each) and evaluates barycentric positions in km, ICRF axes,
at a TDB Julian date. Only python-casacore's table reader is used; the Chebyshev evaluation is
the standard JPL one (record layout from the DE405 header: start index, coefficients, sub-intervals).
Run with Debian's /usr/bin/python3 (python3-casacore, python3-erfa)."""
import numpy as np
import casacore.tables as ct

PATH = '/usr/share/casacore/data/ephemerides/DE405'
# body: (1-based start index in the record, coefficients per component, sub-intervals)
LAYOUT = {
    'mercury': (3, 14, 4), 'venus': (171, 10, 2), 'emb': (231, 13, 2), 'mars': (309, 11, 1),
    'jupiter': (342, 8, 1), 'saturn': (366, 7, 1), 'uranus': (387, 6, 1), 'neptune': (405, 6, 1),
    'pluto': (423, 6, 1), 'moon': (441, 13, 8), 'sun': (753, 11, 2),
}

_tb = ct.table(PATH, ack=False)
_KW = _tb.getkeywords()
EMRAT = _KW['EMRAT']
AU_KM = _KW['AU']
C_KMS = _KW['CLIGHT']
_X = _tb.getcol('x')  # coefficients from the record's 3rd word on (the two Julian dates are left out)
_MJD = _tb.getcol('MJD')  # start of each 32-day record (checked against ERFA epv00 below)
_tb.close()
SPAN = 32.0


def _record(jd):
    mjd = jd - 2400000.5
    i = int(np.searchsorted(_MJD, mjd, side='right') - 1)
    start = _MJD[i] + 2400000.5
    end = start + SPAN
    assert start <= jd <= end, (jd, start, end)
    return start, end, _X[i]


def _cheb(rec, body, jd):
    r0, r1, coef = rec
    start, n, sub = LAYOUT[body]
    span = (r1 - r0) / sub
    k = min(int((jd - r0) // span), sub - 1)
    t0 = r0 + k * span
    x = 2 * (jd - t0) / span - 1
    base = start - 3 + k * 3 * n
    c = coef[base:base + 3 * n].reshape(3, n)
    T = np.zeros(n)
    T[0] = 1
    if n > 1:
        T[1] = x
    for j in range(2, n):
        T[j] = 2 * x * T[j - 1] - T[j - 2]
    return c @ T  # km


def barycentric_km(body, jd_tdb):
    """Position of a body relative to the solar-system barycentre, km, ICRF."""
    rec = _record(jd_tdb)
    if body in ('earth', 'moon'):
        emb = _cheb(rec, 'emb', jd_tdb)
        moon_geo = _cheb(rec, 'moon', jd_tdb)
        earth = emb - moon_geo / (1 + EMRAT)
        return earth if body == 'earth' else earth + moon_geo
    return _cheb(rec, body, jd_tdb)


def barycentric_velocity_kms(body, jd_tdb, h=1e-3):
    """Central difference (h days), km/s."""
    return (barycentric_km(body, jd_tdb + h) - barycentric_km(body, jd_tdb - h)) / (2 * h * 86400)


if __name__ == '__main__':
    import erfa
    # Self-check against ERFA epv00 (Earth, accurate to a few km): prints the difference in km.
    for jd in (2451545.0, 2460000.5, 2465000.25):
        pvh, pvb = erfa.epv00(jd, 0.0)
        e = barycentric_km('earth', jd) / AU_KM
        print(jd, np.linalg.norm(e - pvb['p']) * AU_KM, 'km')
