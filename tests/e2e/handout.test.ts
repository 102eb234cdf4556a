/**
 * The printable handout in headless Chromium (SwiftShader, no GPU): it renders, its SVG chart puts a known
 * star where the projection formula says it must be, and it prints to PDF on A4 and US Letter.
 * Screenshot and PDFs go to tests/e2e/output/.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, OUTPUT_DIR, screenshot } from './helpers/browser';

/** Sirius, ICRS α 06h45m08.91728s δ −16°42′58.0171″; from φ 51.4769°, λ 0° at 2024-01-15T22:00:00Z its
 * standard-refraction altitude is 20.279789° at azimuth 162.938748° (ERFA atco13; reference-values.md E1). */
const SIRIUS = { ra: (6 + 45 / 60 + 8.91728 / 3600) * 15, dec: -(16 + 42 / 60 + 58.0171 / 3600), alt: 20.279789, az: 162.938748 };

const world = e2eWorld();

browserTest('the handout renders, places Sirius by r = (90° − alt)/90° · R, and prints on A4 and Letter', async () => {
  const browser = await world.browser();
  const { page, context, realErrors, cspViolations } = await newPage(browser, { baseURL: world.url, viewport: { width: 1100, height: 1400 } });
  const signIn = await context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } });
  expect(signIn.status()).toBe(200);
  const me = await (await context.request.get('/api/me')).json();
  const teamId = me.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await context.request.post('/api/scenes', {
    data: {
      teamId,
      title: 'Winter evening: Sirius check',
      site: { name: 'E1 test site', lat: 51.4769, lon: 0, height: 0, timeZone: 'Europe/London' },
      time: '2024-01-15T22:00:00Z',
      envelope: { name: 'Demo floor', minAltitude: 15, horizonMask: [[0, 5], [90, 12.5], [180, 10], [270, 8]] },
      targets: [{ id: 't1', kind: 'custom', name: 'Sirius (E1)', ra: SIRIUS.ra, dec: SIRIUS.dec }],
      steps: [{ id: 's1', title: 'Find the Dog Star', time: '2024-01-15T22:00:00Z', caption: 'Look **south-south-east**, low.\n\n- about 20° up' }],
    },
  });
  expect(created.status()).toBe(201);
  const sceneId = (await created.json()).scene.id;

  await page.goto(`/scenes/${sceneId}/handout`);
  const svg = page.locator('svg#sky-chart');
  await svg.waitFor();
  await page.getByRole('heading', { level: 1, name: 'Winter evening: Sirius check' }).waitFor();
  await page.getByText('Computed times are for planning; local rules and instrument interlocks take precedence.').waitFor();
  await screenshot(page, 'handout');

  const frame = await svg.evaluate((el) => ({ R: Number(el.dataset.r), cx: Number(el.dataset.cx), cy: Number(el.dataset.cy) }));
  const mark = page.locator('circle.target[data-name="Sirius (E1)"]');
  const xy = await mark.evaluate((el) => ({ x: Number(el.getAttribute('cx')), y: Number(el.getAttribute('cy')) }));
  const d = Math.PI / 180;
  const r = ((90 - SIRIUS.alt) / 90) * frame.R;
  // North up, east LEFT: x = cx − r sin A, y = cy − r cos A. 5″ of model difference is 0.003 px here.
  expect(xy.x).toBeCloseTo(frame.cx - r * Math.sin(SIRIUS.az * d), 1);
  expect(xy.y).toBeCloseTo(frame.cy - r * Math.cos(SIRIUS.az * d), 1);
  // The catalogue dot for HR 2491 (Sirius in the Bright Star Catalogue) sits on the same spot (< 0.05°).
  const star = await page.locator('circle.star[data-hr="2491"]').evaluate((el) => ({ x: Number(el.getAttribute('cx')), y: Number(el.getAttribute('cy')) }));
  expect(Math.hypot(star.x - xy.x, star.y - xy.y)).toBeLessThan((0.05 / 90) * frame.R);
  // Cardinal letters: E left of the centre, W right, N above.
  const card = await page.locator('text.cardinal').evaluateAll((els) => Object.fromEntries(els.map((e) => [e.textContent, Number(e.getAttribute('x')) + Number(e.getAttribute('y')) * 1e-6])));
  expect(card.E!).toBeLessThan(frame.cx);
  expect(card.W!).toBeGreaterThan(frame.cx);
  await expect.poll(() => page.getByText('east LEFT').count()).toBeGreaterThan(0);

  // The caption's Markdown is rendered, with no raw HTML path; the events table lists the Sun's twilights.
  expect(await page.locator('.caption strong').first().textContent()).toBe('south-south-east');
  await page.getByText(/civil dusk/).first().waitFor();

  mkdirSync(OUTPUT_DIR, { recursive: true });
  for (const [paper, format] of [['a4', 'A4'], ['letter', 'Letter']] as const) {
    await page.goto(`/scenes/${sceneId}/handout?paper=${paper}`);
    await svg.waitFor();
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('nav.toolbar').isVisible()).toBe(false);
    const pdf = await page.pdf({ path: join(OUTPUT_DIR, `handout-${paper}.pdf`), format, preferCSSPageSize: true, printBackground: true });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    // Chart on page 1, events on page 2: a short scene fits on two or three sheets of either size.
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    expect(pages).toBeGreaterThanOrEqual(2);
    expect(pages).toBeLessThanOrEqual(3);
    await page.emulateMedia({ media: 'screen' });
  }
  expect(cspViolations()).toEqual([]);
  expect(realErrors()).toEqual([]);
});
