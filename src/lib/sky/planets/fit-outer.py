"""Fits the correction that brings VSOP87B's Uranus and Neptune onto JPL DE405 over 1960–2060.

VSOP87 was fitted to DE200, whose outer planets are off by 1–3″ against later ephemerides; DE405
(Debian's casacore-data-jpl-de405, read by tests/reference/de405.py) is the reference. The differences
in heliocentric L, B, R (VSOP87 frame) are smooth over the century (the orbits take 84 and 165 years),
so a polynomial of degree 6 in τ (Julian millennia TDB from J2000) is fitted by least squares to
monthly samples. Run by hand with Debian's python:

    /usr/bin/python3 src/lib/sky/planets/fit-outer.py

It rewrites outer-corrections.json and prints the residuals (arcseconds). Uses the product's own
truncated series (vsop87b.json) so the correction also absorbs its truncation.
"""
import json
import math
import os
import sys

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, '..', '..', '..', '..', 'tests', 'reference'))
import de405  # noqa: E402

SERIES = json.load(open(os.path.join(HERE, 'vsop87b.json')))['bodies']
M = np.array([[1, 0.00000044036, -0.000000190919],
              [-0.000000479966, 0.917482137087, -0.397776982902],
              [0, 0.397776982902, 0.917482137087]])
DEGREE = 6
JD_FROM, JD_TO = 2437300.5, 2473400.5  # 1961-01 … 2059-11, inside the DE405 file
AS = 180 / math.pi * 3600


def vsop(body, tau):
    def total(rows):
        out, tp = 0.0, 1.0
        for row in rows:
            r = np.array(row).reshape(-1, 3)
            out += np.sum(r[:, 0] * np.cos(r[:, 1] + r[:, 2] * tau)) * tp
            tp *= tau
        return out
    s = SERIES[body]
    return total(s['L']), total(s['B']), total(s['R'])


def de405_lbr(body, jd):
    h = (de405.barycentric_km(body, jd) - de405.barycentric_km('sun', jd)) / de405.AU_KM
    e = np.linalg.solve(M, h)
    return math.atan2(e[1], e[0]), math.atan2(e[2], math.hypot(e[0], e[1])), float(np.linalg.norm(e))


out = {'source': 'fit-outer.py: DE405 − VSOP87B (vsop87b.json), least squares, degree %d in τ (Julian millennia TDB from J2000)' % DEGREE,
       'tauRange': [(JD_FROM - 2451545) / 365250, (JD_TO - 2451545) / 365250], 'bodies': {}}
for body in ('uranus', 'neptune'):
    jds = np.arange(JD_FROM, JD_TO, 30.0)
    taus = (jds - 2451545) / 365250
    d = []
    for jd, tau in zip(jds, taus):
        L, B, R = de405_lbr(body, jd)
        l, b, r = vsop(body, tau)
        d.append(((L - l + math.pi) % (2 * math.pi) - math.pi, B - b, R - r))
    d = np.array(d)
    V = np.vander(taus, DEGREE + 1, increasing=True)
    coef = {}
    for k, name in enumerate('LBR'):
        c, *_ = np.linalg.lstsq(V, d[:, k], rcond=None)
        res = d[:, k] - V @ c
        scale = AS if name != 'R' else AS / vsop(body, 0)[2]
        print(body, name, 'raw max %.3f″, residual max %.3f″' % (np.max(np.abs(d[:, k])) * scale, np.max(np.abs(res)) * scale))
        coef[name] = [float('%.12g' % x) for x in c]
    out['bodies'][body] = coef
json.dump(out, open(os.path.join(HERE, 'outer-corrections.json'), 'w'), indent=1)
print('wrote outer-corrections.json')
