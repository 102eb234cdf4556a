/** Evaluate an envelope for a target at a site and instant (Sun and Moon computed here). */
import { skyFrame } from './apparent';
import { bodyPlace } from './bodies';
import { observeAt, type Target } from './observe';
import { evaluateEnvelope, type Envelope, type EnvelopeEvaluation } from './envelope';
import type { SiteInput } from './frames';

export function evaluateEnvelopeAt(env: Envelope, site: SiteInput, date: Date, target: Target): EnvelopeEvaluation & { azDeg: number; altDeg: number } {
  const f = skyFrame(site, date);
  const o = observeAt(f, target, { refraction: 'standard' });
  const sun = env.sunAvoidance !== undefined ? bodyPlace(f, 'sun', 'none') : null;
  const moon = env.moonAvoidance !== undefined ? bodyPlace(f, 'moon', 'none') : null;
  // Separations use unrefracted directions on both sides (as windows.ts does).
  const trueAlt = 'body' in target ? bodyPlace(f, target.body, 'none').altDeg : observeAt(f, target, { refraction: 'none' }).altDeg;
  const r = evaluateEnvelope(env, { azDeg: o.azDeg, altDeg: o.altDeg, haHours: o.haHours, decDeg: o.decOfDateDeg }, {});
  const sep = evaluateEnvelope(
    { sunAvoidance: env.sunAvoidance, moonAvoidance: env.moonAvoidance },
    { azDeg: o.azDeg, altDeg: trueAlt },
    { sun, moon },
  );
  const checks = [...r.checks, ...sep.checks];
  const violations = checks.filter((c) => c.margin < 0);
  return { allowed: violations.length === 0, violations, checks, azDeg: o.azDeg, altDeg: o.altDeg };
}
