/**
 * Work budgets of the compute routes. Work is counted in *evaluations*: one target's place checked
 * against the envelope at one instant of the search grid (targets × span ÷ step, the measure of the
 * windows search). The other jobs are expressed in the same unit by measurement (README.md beside this
 * file): a positions row (rise, transit and set searched 48 h ahead) costs about as much as 12,000
 * evaluations, a handout target (events within ±12 h) about 5,000.
 *
 * Two limits: one request may ask for at most `MAX_WORK_PER_REQUEST` (413 up front, with a message that
 * says what to ask for instead), and a caller may spend at most a number of evaluations a minute (429,
 * counted in the database like every rate limit, so instances share it).
 */
import { HttpError } from '../http';
import { rateLimit } from '../rate-limit';

/** About 5 s of one core here (windows search ≈ 1.2 million evaluations/s on a loaded 2-core machine). */
export const MAX_WORK_PER_REQUEST = 6_000_000;
/** A positions row (next rise/transit/set within 48 h), in evaluations. */
export const POSITION_ROW_WORK = 12_000;
/** A handout target (events within ±12 h), in evaluations; plus a fixed part for the chart. */
export const HANDOUT_TARGET_WORK = 5_000;
export const HANDOUT_BASE_WORK = 100_000;
/** Per minute: anonymous callers (compute API, share links) per address; members per account. */
export const WORK_PER_MINUTE = { anonymous: 20_000_000, member: 60_000_000 } as const;

/** Computed exports (positions, windows, handout) through share links, per address a minute, counted before anything is read. */
export const LINK_EXPORTS_PER_MINUTE = 30;

/** Targets the positions export can take in one request (500). */
export const MAX_POSITION_ROWS = Math.floor(MAX_WORK_PER_REQUEST / POSITION_ROW_WORK);
/** Targets a handout can take in one request (1,180). */
export const MAX_HANDOUT_TARGETS = Math.floor((MAX_WORK_PER_REQUEST - HANDOUT_BASE_WORK) / HANDOUT_TARGET_WORK);

export const windowsWork = (nTargets: number, spanMs: number, stepSec: number) => Math.ceil(Math.max(1, nTargets) * (spanMs / 1000 / stepSec));
export const positionsWork = (nTargets: number) => Math.max(1, nTargets) * POSITION_ROW_WORK;
export const handoutWork = (nTargets: number) => HANDOUT_BASE_WORK + nTargets * HANDOUT_TARGET_WORK;

const millions = (n: number) => (n / 1e6).toFixed(n < 1e7 ? 1 : 0);

/**
 * 413 when `work` is over the per-request limit (`hint` says what a smaller request looks like), else
 * charges it to `key` (429 with Retry-After past the per-minute budget).
 */
export async function chargeWork(key: string, work: number, who: keyof typeof WORK_PER_MINUTE, hint: string): Promise<void> {
  if (work > MAX_WORK_PER_REQUEST) {
    throw new HttpError(
      413,
      'too_much_work',
      `This request needs about ${millions(work)} million evaluations; one request may ask for at most ${millions(MAX_WORK_PER_REQUEST)} million. ${hint}`,
    );
  }
  await rateLimit(`work:${key}`, WORK_PER_MINUTE[who], 60, Date.now(), work);
}
