/**
 * Smooth ephemeris quantities read between nodes on a fixed time grid: the exact function is evaluated
 * only at whole multiples of `stepDays` (TT days since J2000.0) and a value between them is the cubic
 * through the four nearest nodes (Lagrange, nodes k−1 … k+2 around [k, k+1]). Nodes are remembered (the
 * last `keep`), so a run of nearby instants (a night's grid, an event search, a played animation) pays
 * for a few exact evaluations instead of one each.
 *
 * Decision (2026-12-03): the night API spent most of its time on per-instant series (the Earth's VSOP87
 * position for the Sun, the Moon's series, the Earth's velocity, 77-term nutation): about 40 µs of each
 * instant's 50 µs. The quantities are smooth on these grids, so the interpolation error is far below the
 * engine's own error (tests/unit/sky/ephemeris-nodes.test.ts bounds it against the exact functions:
 * ≤ 0.5 m for the Earth and planets, ≤ 1 m for the Moon, ≤ 1 µas for nutation). A value depends on the
 * instant alone (never on what was asked before), so every path gives the same number.
 */
export type NodeFunction = (dTT: number) => ArrayLike<number>;

export function nodeInterpolator(dims: number, stepDays: number, exact: NodeFunction, keep = 48) {
  const nodes = new Map<number, Float64Array>();
  const node = (k: number): Float64Array => {
    let v = nodes.get(k);
    if (!v) {
      if (nodes.size >= keep) nodes.delete(nodes.keys().next().value as number);
      nodes.set(k, (v = Float64Array.from(exact(k * stepDays))));
    }
    return v;
  };
  return <T extends number[] | Float64Array>(dTT: number, out: T): T => {
    const x = dTT / stepDays;
    const k = Math.floor(x);
    const p = x - k;
    const a = node(k - 1), b = node(k), c = node(k + 1), d = node(k + 2);
    const pm1 = p - 1, pm2 = p - 2, pp1 = p + 1;
    const wa = (-p * pm1 * pm2) / 6, wb = (pp1 * pm1 * pm2) / 2, wc = (-pp1 * p * pm2) / 2, wd = (pp1 * p * pm1) / 6;
    for (let i = 0; i < dims; i++) out[i] = wa * a[i] + wb * b[i] + wc * c[i] + wd * d[i];
    return out;
  };
}
