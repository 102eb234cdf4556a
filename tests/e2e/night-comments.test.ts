/**
 * A reviewer pins a comment to a point of the altitude chart (a target at a time) through the UI of a
 * reviewer link — click on the curve, "Comment here", the form — and then everyone sees it on the chart:
 * a viewer link and the editor's workspace draw the marker at that target and time, where the night API
 * puts the target's altitude (checked in screen pixels against the drawn plot area), and reading the
 * marker gives the comment's text. The form can also be opened and filled from the keyboard.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { expect } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

/** axe-core's serious and critical findings inside the night panel (the chart, the comment form and list). */
async function axeNightPanel(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Element, opts: object) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const r = await axe.run(document.querySelector('[data-testid=night-panel]')!, { resultTypes: ['violations'] });
    return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id} (${v.help}): ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
  });
}
const SITE = { name: 'Night comment test site', lat: 37.2, lon: -3.6, height: 2800, timeZone: 'Europe/Madrid' };
const TARGETS = [
  { id: 't1', kind: 'custom', name: 'Field A', ra: 83.8221, dec: -5.3911 },
  { id: 't2', kind: 'custom', name: 'Field B', ra: 150.2, dec: 40.1 },
];
const BODY = 'Field B is worth a longer exposure here: the Moon is down.';

interface NightJson {
  from: string;
  to: string;
  targets: { name: string; samples: { time: string; altitude: number }[] }[];
}

/** Screen position of (instant, altitude) on a drawn altitude chart: the plot area is the chart's clip rectangle (time across, 0–90° up). */
async function screenPoint(chart: Locator, night: NightJson, t: number, alt: number): Promise<{ x: number; y: number }> {
  return chart.evaluate(
    (svg, a) => {
      const r = (svg as SVGSVGElement).querySelector('clipPath rect')!;
      const x0 = Number(r.getAttribute('x')), y0 = Number(r.getAttribute('y')), w = Number(r.getAttribute('width')), h = Number(r.getAttribute('height'));
      const vx = x0 + ((a.t - a.from) / (a.to - a.from)) * w;
      const vy = y0 + h * (1 - a.alt / 90);
      const m = (svg as SVGSVGElement).getScreenCTM()!;
      return { x: m.a * vx + m.c * vy + m.e, y: m.b * vx + m.d * vy + m.f };
    },
    { t, alt, from: Date.parse(night.from), to: Date.parse(night.to) },
  );
}

/** Screen position of a comment marker's tip (its path starts at the pinned point). */
async function markerTip(marker: Locator): Promise<{ x: number; y: number }> {
  return marker.evaluate((g) => {
    const d = g.querySelector('path')!.getAttribute('d')!;
    const [, x, y] = /^M(-?[\d.]+),(-?[\d.]+)/.exec(d)!;
    const m = (g as SVGGElement).ownerSVGElement!.getScreenCTM()!;
    const vx = Number(x), vy = Number(y);
    return { x: m.a * vx + m.c * vy + m.e, y: m.b * vx + m.d * vy + m.f };
  });
}

async function openNight(page: Page) {
  await page.getByTestId('sheet-toggle').click();
  const chart = page.locator('[data-testid=night-panel] svg[data-testid=altitude-chart]');
  await chart.locator('g.night-curve').first().waitFor({ timeout: 90_000 });
  await chart.scrollIntoViewIfNeeded();
  return chart;
}

browserTest('a reviewer pins a comment to the altitude chart; a viewer link and the workspace show it at that target and time', async () => {
  const browser = await world.browser();
  const editor = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  expect((await editor.context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } })).status()).toBe(200);
  const me = await (await editor.context.request.get('/api/me')).json();
  const teamId = me.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  const created = await editor.context.request.post('/api/scenes', {
    data: { teamId, title: 'Night review: two fields', site: SITE, time: '2026-03-20T22:00:00Z', envelope: { name: 'Test mount', minAltitude: 20 }, targets: TARGETS },
  });
  expect(created.status()).toBe(201);
  const sceneId = (await created.json()).scene.id as string;
  const link = async (role: 'viewer' | 'reviewer') => {
    const r = await editor.context.request.post(`/api/scenes/${sceneId}/links`, { data: { role } });
    expect(r.status()).toBe(201);
    const j = (await r.json()) as { url: string; token: string };
    return { path: new URL(j.url).pathname, token: j.token };
  };
  const reviewerLink = await link('reviewer');
  const viewerLink = await link('viewer');

  // ---- the reviewer (no account) clicks on Field B's curve where it stands well apart from Field A ----
  const rev = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  await rev.page.goto(reviewerLink.path);
  const revChart = await openNight(rev.page);
  const night = (await (await rev.context.request.get(`/api/shared/${reviewerLink.token}/night`)).json()) as NightJson;
  const a = night.targets.find((t) => t.name === 'Field A')!.samples, b = night.targets.find((t) => t.name === 'Field B')!.samples;
  const from = Date.parse(night.from), to = Date.parse(night.to);
  const candidates = b
    .map((s, i) => ({ t: Date.parse(s.time), alt: s.altitude, gap: Math.abs(s.altitude - a[i].altitude) }))
    .filter((s) => s.alt > 15 && s.alt < 80 && s.gap > 12 && s.t > from + 0.1 * (to - from) && s.t < to - 0.1 * (to - from));
  expect(candidates.length).toBeGreaterThan(0);
  const aim = candidates.reduce((p, q) => (q.alt > p.alt ? q : p));
  const click = await screenPoint(revChart, night, aim.t, aim.alt);
  await rev.page.mouse.click(click.x, click.y);
  const offer = rev.page.getByTestId('chart-comment-offer');
  await offer.waitFor();
  expect(await offer.textContent()).toContain('Field B');
  await screenshot(rev.page, 'night-comment-offer-1440x900');
  await offer.getByRole('button', { name: 'Comment here' }).click();
  const form = rev.page.getByTestId('chart-comment-form');
  await form.waitFor();
  expect(await form.getByTestId('chart-comment-target').inputValue()).toBe('Field B');
  await form.getByLabel('Your name (shown with your comment)').fill('Ines Reviewer');
  await form.getByRole('textbox', { name: 'Comment', exact: true }).fill(BODY);
  // the point being commented on is marked on the chart while the form is open
  expect(await revChart.locator('[data-part=pending-comment]').count()).toBe(1);
  await screenshot(rev.page, 'night-comment-form-1440x900');
  expect(await axeNightPanel(rev.page)).toEqual([]);
  await form.getByRole('button', { name: 'Post comment' }).click();
  await form.waitFor({ state: 'detached' });
  await revChart.locator('g[data-comment]').first().waitFor({ timeout: 20_000 });

  // ---- what was stored: a chart anchor on Field B at the clicked instant (one pixel ≈ one minute here) ----
  const list = (await (await editor.context.request.get(`/api/scenes/${sceneId}/comments`)).json()) as { comments: { id: string; body: string; anchor: { chart: string; target: string; time: string } }[] };
  const posted = list.comments.find((c) => c.body === BODY)!;
  expect(posted).toBeDefined();
  expect(posted.anchor.chart).toBe('altitude');
  expect(posted.anchor.target).toBe('Field B');
  const pinned = Date.parse(posted.anchor.time);
  expect(Math.abs(pinned - aim.t)).toBeLessThan(3 * 60_000);
  // the target's altitude at exactly that instant, from the night API (a one-minute span sampled at its start)
  const exact = (await (await editor.context.request.get(`/api/scenes/${sceneId}/night?from=${posted.anchor.time}&to=${new Date(pinned + 60_000).toISOString()}&step=1`)).json()) as NightJson;
  const altAtPin = exact.targets.find((t) => t.name === 'Field B')!.samples[0];
  expect(altAtPin.time).toBe(posted.anchor.time);

  /** The marker on a page's chart sits at (pinned instant, altitude then), and reading it gives the comment. */
  const checkMarker = async (page: Page, chart: Locator, who: string) => {
    const marker = chart.locator(`g[data-comment="${posted.id}"]`);
    await marker.waitFor({ timeout: 45_000 });
    expect(await marker.getAttribute('data-target')).toBe('Field B');
    const tip = await markerTip(marker);
    const want = await screenPoint(chart, night, pinned, altAtPin.altitude);
    expect(Math.abs(tip.x - want.x), `${who}: marker x`).toBeLessThan(1.5);
    expect(Math.abs(tip.y - want.y), `${who}: marker y`).toBeLessThan(1.5);
    expect(await marker.locator('title').textContent()).toContain(BODY);
    expect(await marker.locator('title').textContent()).toContain('Ines Reviewer');
    const item = page.locator(`[data-testid=chart-comment-list] li[data-comment="${posted.id}"]`);
    expect(await item.textContent()).toContain(BODY);
  };
  await checkMarker(rev.page, revChart, 'reviewer link');

  // ---- a viewer link (read-only, no comment form) ----
  const viewer = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  await viewer.page.goto(viewerLink.path);
  const viewChart = await openNight(viewer.page);
  await checkMarker(viewer.page, viewChart, 'viewer link');
  expect(await viewer.page.getByTestId('chart-comment-open').count()).toBe(0);
  await screenshot(viewer.page, 'night-comment-viewer-1440x900');
  expect(await axeNightPanel(viewer.page)).toEqual([]);

  // ---- the editor's workspace; and the form from the keyboard ----
  await editor.page.goto(`/scenes/${sceneId}`);
  const edChart = await openNight(editor.page);
  await checkMarker(editor.page, edChart, 'workspace');
  await editor.page.getByTestId('chart-comment-open').focus();
  await editor.page.keyboard.press('Enter');
  const edForm = editor.page.getByTestId('chart-comment-form');
  await edForm.waitFor();
  // the focus lands on the target choice; arrow keys change it, Tab reaches the time steps and the comment
  expect(await editor.page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('chart-comment-target');
  const before = await edForm.getByTestId('chart-comment-time').textContent();
  await edForm.getByRole('button', { name: '+5 min' }).focus();
  await editor.page.keyboard.press('Enter');
  expect(await edForm.getByTestId('chart-comment-time').textContent()).not.toBe(before);
  await edForm.getByRole('textbox', { name: 'Comment', exact: true }).focus();
  await editor.page.keyboard.type('Keyboard note');
  await edForm.getByRole('button', { name: 'Post comment' }).focus();
  await editor.page.keyboard.press('Enter');
  await edForm.waitFor({ state: 'detached' });
  await expect.poll(async () => edChart.locator('g[data-comment]').count(), { timeout: 20_000 }).toBe(2);
  await screenshot(editor.page, 'night-comment-workspace-1440x900');
  for (const [w, h] of [[1920, 1080], [390, 844]] as const) {
    await rev.page.setViewportSize({ width: w, height: h });
    await revChart.scrollIntoViewIfNeeded();
    await screenshot(rev.page, `night-comment-reviewer-${w}x${h}`);
  }

  for (const p of [editor, rev, viewer]) expect(p.realErrors()).toEqual([]);
});
