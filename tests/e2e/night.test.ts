/**
 * The night charts in headless Chromium: the altitude chart draws one curve per target, dragging its
 * cursor moves the sphere's time (and the sphere's time moves the cursor), the sky-coverage chart and
 * the figures table are there, and the printed handout includes the chart. Screenshots at 1440×900,
 * 1920×1080 and 390×844 go to tests/e2e/output/.
 */
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();
const TARGETS = [
  { id: 't1', kind: 'custom', name: 'Field A', ra: 83.8221, dec: -5.3911 },
  { id: 't2', kind: 'custom', name: 'Field B', ra: 150.2, dec: 40.1 },
  { id: 't3', kind: 'star', name: 'Vega', hr: 7001 },
  { id: 't4', kind: 'body', name: 'Jupiter', body: 'jupiter' },
];

async function makeScene(context: import('playwright-core').BrowserContext) {
  const signIn = await context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } });
  expect(signIn.status()).toBe(200);
  const me = await (await context.request.get('/api/me')).json();
  const teamId = me.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await context.request.post('/api/scenes', {
    data: {
      teamId,
      title: 'Night plan: four targets',
      site: { name: 'Night test site', lat: 37.2, lon: -3.6, height: 2800, timeZone: 'Europe/Madrid' },
      time: '2026-03-20T22:00:00Z',
      envelope: { name: 'Test mount', minAltitude: 20, maxAltitude: 85, keyholeRadius: 4, moonAvoidance: 15, azimuthRanges: [[20, 340]], horizonMask: [[0, 10], [90, 25], [180, 12], [270, 18]] },
      targets: TARGETS,
    },
  });
  expect(created.status()).toBe(201);
  return (await created.json()).scene.id as string;
}

browserTest('the altitude chart draws one curve per target, its cursor and the sphere share the time, the handout has the chart', async () => {
  const browser = await world.browser();
  const { page, context, realErrors } = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  const sceneId = await makeScene(context);
  await page.goto(`/scenes/${sceneId}`);
  // The night charts live in a sheet under the sky, opened from the title strip (closed at first).
  await page.getByTestId('sheet-toggle').click();
  const chart = page.locator('[data-testid=altitude-chart]');
  await chart.waitFor({ timeout: 60_000 });
  // one curve group per target, in the scene's order, each with at least one drawn run
  const names = await chart.locator('g.night-curve').evaluateAll((els) => els.map((e) => e.getAttribute('data-target')));
  expect(names).toEqual(TARGETS.map((t) => t.name));
  for (const n of names) expect(await chart.locator(`g.night-curve[data-target="${n}"] path`).count()).toBeGreaterThan(0);
  // inside-window parts are drawn apart from the rest
  expect(await chart.locator('path[data-inside=true]').count()).toBeGreaterThan(0);
  expect(await chart.locator('title').first().textContent()).toMatch(/^Altitude over time/);
  await page.locator('[data-testid=coverage-chart]').waitFor();
  await page.locator('[data-testid=night-figures] tbody tr').first().waitFor();
  expect(await page.locator('[data-testid=night-figures] tbody tr').count()).toBe(4);

  // drag the cursor to three quarters of the span: the sphere's UTC readout follows
  const utc = page.locator('[data-testid=time-utc]');
  await utc.waitFor({ state: 'attached', timeout: 60_000 }); // the time readout may sit in a closed panel
  const before = await utc.textContent();
  const area = page.locator('[data-testid=altitude-chart-cursor]');
  await area.scrollIntoViewIfNeeded();
  const box = (await area.boundingBox())!;
  await page.mouse.move(box.x + box.width * 0.5, box.y + box.height / 2);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.75, box.y + box.height / 2, { steps: 5 });
  await page.mouse.up();
  const data = await (await context.request.get(`/api/scenes/${sceneId}/night`)).json();
  const from = Date.parse(data.from), to = Date.parse(data.to);
  const want = from + 0.75 * (to - from);
  await expect.poll(async () => Math.abs(Date.parse((await utc.textContent())!.replace(' UTC', 'Z').replace(' ', 'T')) - want), { timeout: 15_000 }).toBeLessThan(3 * 60_000);
  expect(await utc.textContent()).not.toBe(before);
  const valueNow = Number(await area.getAttribute('aria-valuenow'));
  expect(Math.abs(valueNow - want)).toBeLessThan(3 * 60_000);

  // the sphere's time bar moves the chart's cursor: one hour on
  await page.locator('[data-testid=step-plus-hour]').dispatchEvent('click');
  await expect.poll(async () => Number(await area.getAttribute('aria-valuenow')) - valueNow, { timeout: 10_000 }).toBeGreaterThan(3_500_000);

  // hovering a row of the figures highlights its curve (the others dim)
  await page.locator('[data-testid=night-figures] tbody tr[data-target="Field B"]').hover();
  await expect.poll(() => chart.locator('g.night-curve[data-target="Field A"]').getAttribute('opacity')).toBe('0.25');
  expect(await chart.locator('g.night-curve[data-target="Field B"]').getAttribute('opacity')).toBe('1');
  await page.mouse.move(0, 0);

  await page.locator('[data-testid=night-panel]').scrollIntoViewIfNeeded();
  await screenshot(page, 'night-1440x900');
  for (const [w, h] of [[1920, 1080], [390, 844]] as const) {
    await page.setViewportSize({ width: w, height: h });
    await page.locator('[data-testid=night-panel]').scrollIntoViewIfNeeded();
    await screenshot(page, `night-${w}x${h}`);
  }

  // the SVG download is a standalone SVG with the same curves
  const svg = await context.request.get(`/api/scenes/${sceneId}/night.svg`);
  expect(svg.status()).toBe(200);
  expect(svg.headers()['content-type']).toMatch(/^image\/svg\+xml/);
  const svgText = await svg.text();
  expect((svgText.match(/class="night-curve"/g) ?? []).length).toBe(4);

  // the handout includes the chart
  await page.setViewportSize({ width: 1100, height: 1400 });
  await page.goto(`/scenes/${sceneId}/handout`);
  const handoutChart = page.locator('[data-testid=handout-night] svg[data-testid=altitude-chart]');
  await handoutChart.waitFor();
  expect(await handoutChart.locator('g.night-curve').count()).toBe(4);
  await screenshot(page, 'night-handout');
  expect(realErrors()).toEqual([]);
});
