/**
 * A tour of every page a user meets, at a laptop (1440 × 900) and a phone (390 × 844): landing, sky,
 * sign-in, the API page, dashboard, each demo scene, a handout, new scene, account, a viewer link, a reviewer link, the
 * presenter and a follower of the presentation. Each page fails the tour on a console error (a
 * Content-Security-Policy violation is reported as one), an uncaught error, a failed request (network failure or 4xx/5xx answer), a horizontal scrollbar, or — on the
 * presenter's and the follower's stage — any element drawn over the step's caption. Every page is also
 * checked with axe-core (Deque's rules for WCAG 2.x): no serious or critical finding. Screenshots of each
 * page go to tests/e2e/output/tour-<viewport>-<page>.png.
 */
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, reportCspViolations, screenshot } from './helpers/browser';

const world = e2eWorld();
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

const VIEWPORTS = [
  { name: 'laptop', width: 1440, height: 900 },
  { name: 'phone', width: 390, height: 844 },
] as const;

interface Watch {
  problems: string[];
  /** Starts recording for the page named `name`. */
  at: (name: string) => void;
}

/** Records console errors, page errors and failed requests of every page of a context. */
function watch(context: BrowserContext): Watch {
  let current = '(before the first page)';
  const problems: string[] = [];
  const hook = (page: Page) => {
    page.on('console', (m) => {
      if (m.type() === 'error') problems.push(`${current}: console error: ${m.text()}`);
    });
    page.on('pageerror', (e) => problems.push(`${current}: uncaught error: ${e.message}`));
    page.on('requestfailed', (r) => {
      const why = r.failure()?.errorText ?? '';
      // A stream or image cut off by leaving the page is not a failure of the page.
      if (why === 'net::ERR_ABORTED') return;
      problems.push(`${current}: request failed: ${r.method()} ${r.url()} (${why})`);
    });
    page.on('response', (r) => {
      if (r.status() >= 400) problems.push(`${current}: ${r.status()} for ${r.request().method()} ${r.url()}`);
    });
  };
  context.pages().forEach(hook);
  context.on('page', hook);
  return { problems, at: (name) => void (current = name) };
}

async function context(browser: Browser, vp: (typeof VIEWPORTS)[number], user?: string): Promise<{ ctx: BrowserContext; page: Page; w: Watch }> {
  const ctx = await browser.newContext({ baseURL: world.url, viewport: { width: vp.width, height: vp.height }, colorScheme: 'dark', reducedMotion: 'reduce', deviceScaleFactor: 1, isMobile: vp.name === 'phone', hasTouch: vp.name === 'phone' });
  if (user) {
    const r = await ctx.request.post('/api/auth/sign-in', { data: { email: user, password: DEMO.password } });
    expect(r.status()).toBe(200);
  }
  // A CSP violation (one of our own scripts refused, say) is reported as a console error: it fails the page.
  await ctx.addInitScript(reportCspViolations);
  const w = watch(ctx);
  const page = await ctx.newPage();
  return { ctx, page, w };
}

/** Waits for the page to settle: loaded, fonts ready, the sky's first frame drawn where there is one. */
async function settle(page: Page) {
  await page.waitForLoadState('load');
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  const canvas = page.locator('canvas');
  if (await canvas.count()) await page.waitForTimeout(2500);
  else await page.waitForTimeout(600);
}

/** Elements wider than the viewport, when the page scrolls sideways. */
async function horizontalOverflow(page: Page): Promise<string | null> {
  return page.evaluate(() => {
    const el = document.scrollingElement ?? document.documentElement;
    if (el.scrollWidth <= el.clientWidth + 1) return null;
    const vw = el.clientWidth;
    const wide = [...document.body.querySelectorAll<HTMLElement>('*')]
      .filter((e) => e.getBoundingClientRect().right > vw + 1 && e.getClientRects().length)
      .slice(0, 4)
      .map((e) => `${e.tagName.toLowerCase()}${e.id ? '#' + e.id : ''}${e.getAttribute('data-testid') ? `[data-testid=${e.getAttribute('data-testid')}]` : ''}.${[...e.classList].slice(0, 3).join('.')} (right ${Math.round(e.getBoundingClientRect().right)})`);
    return `scrollWidth ${el.scrollWidth} > ${vw}: ${wide.join(', ')}`;
  });
}

/** axe-core's serious and critical findings on the page. */
async function axeFindings(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const out = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const r = await axe.run(document, { resultTypes: ['violations'] });
    return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id} (${v.help}): ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
  });
  return out;
}

/**
 * Points over the caption's box where something other than the caption is on top: the caption must be
 * the topmost element everywhere inside its own box (a 6 × 4 grid of points, 2 px in from the edges).
 */
async function drawnOverCaption(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const cap = document.querySelector<HTMLElement>('[data-testid="stage-caption"]');
    if (!cap) return ['no [data-testid="stage-caption"] on the stage'];
    const r = cap.getBoundingClientRect();
    if (r.width < 4 || r.height < 4) return [`the caption is not visible (${Math.round(r.width)} × ${Math.round(r.height)})`];
    const found = new Set<string>();
    for (let i = 0; i < 6; i++)
      for (let j = 0; j < 4; j++) {
        const x = r.left + 2 + ((r.width - 4) * i) / 5;
        const y = r.top + 2 + ((r.height - 4) * j) / 3;
        if (x < 0 || y < 0 || x >= innerWidth || y >= innerHeight) {
          found.add(`caption point (${Math.round(x)}, ${Math.round(y)}) is off screen`);
          continue;
        }
        const top = document.elementFromPoint(x, y);
        if (top && !cap.contains(top) && !top.contains(cap)) found.add(`${top.tagName.toLowerCase()}${top.getAttribute('data-testid') ? `[data-testid=${top.getAttribute('data-testid')}]` : ''} "${(top.textContent ?? '').trim().slice(0, 40)}"`);
      }
    return [...found];
  });
}

/** Opens a page of the tour and checks it; returns the problems found there (besides the watcher's). */
async function visit(page: Page, w: Watch, vp: string, name: string, go: () => Promise<unknown>, extra?: () => Promise<string[]>): Promise<string[]> {
  const label = `${vp} ${name}`;
  w.at(label);
  await go();
  await settle(page);
  const problems: string[] = [];
  const over = await horizontalOverflow(page);
  if (over) problems.push(`${label}: horizontal scrollbar: ${over}`);
  if (extra) for (const p of await extra()) problems.push(`${label}: ${p}`);
  await screenshot(page, `tour-${vp}-${name}`);
  for (const f of await axeFindings(page)) problems.push(`${label}: axe ${f}`);
  return problems;
}

async function demo(browser: Browser) {
  const ctx = await browser.newContext({ baseURL: world.url });
  await ctx.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } });
  const { scenes } = (await (await ctx.request.get('/api/scenes')).json()) as { scenes: { id: string; title: string }[] };
  const briefing = scenes.find((s) => s.title === 'Equinox evening briefing')!;
  const link = async (role: 'viewer' | 'reviewer') => {
    const r = await ctx.request.post(`/api/scenes/${briefing.id}/links`, { data: { role } });
    expect(r.status()).toBe(201);
    return new URL(((await r.json()) as { url: string }).url).pathname;
  };
  const out = { scenes, briefing, viewer: await link('viewer'), reviewer: await link('reviewer') };
  await ctx.close();
  return out;
}

for (const vp of VIEWPORTS) {
  browserTest(
    `tour at ${vp.width} × ${vp.height}: no console error, failed request, sideways scroll or serious axe finding on any page`,
    async () => {
      const browser = await world.browser();
      const d = await demo(browser);
      const problems: string[] = [];

      // Without an account.
      const anon = await context(browser, vp);
      for (const [name, path] of [['landing', '/'], ['sky', '/sky'], ['sign-in', '/sign-in'], ['viewer-link', d.viewer], ['reviewer-link', d.reviewer], ['api-docs', '/docs/api']] as const) {
        problems.push(...(await visit(anon.page, anon.w, vp.name, name, () => anon.page.goto(path))));
      }

      // Signed in as the demo editor.
      const ed = await context(browser, vp, DEMO.editor);
      problems.push(...(await visit(ed.page, ed.w, vp.name, 'dashboard', () => ed.page.goto('/dashboard'))));
      // Every demo scene's thumbnail answers (the dashboard shows them; lazy images below the fold may not load by themselves).
      for (const s of d.scenes) expect((await ed.ctx.request.get(`/api/scenes/${s.id}/thumbnail.png`)).status(), s.title).toBe(200);
      for (const [i, s] of d.scenes.entries()) problems.push(...(await visit(ed.page, ed.w, vp.name, `scene-${i + 1}`, () => ed.page.goto(`/scenes/${s.id}`))));
      problems.push(...(await visit(ed.page, ed.w, vp.name, 'handout', () => ed.page.goto(`/scenes/${d.briefing.id}/handout`))));
      problems.push(...(await visit(ed.page, ed.w, vp.name, 'new-scene', () => ed.page.goto('/scenes/new'))));
      problems.push(...(await visit(ed.page, ed.w, vp.name, 'account', () => ed.page.goto('/account'))));

      // The presenter: the editor presents the briefing from its scene page.
      problems.push(
        ...(await visit(
          ed.page,
          ed.w,
          vp.name,
          'presenter',
          async () => {
            await ed.page.goto(`/scenes/${d.briefing.id}`);
            await settle(ed.page);
            await ed.page.getByRole('button', { name: /Start presenting/ }).first().click();
            await ed.page.locator('[data-testid="stage-caption"], [data-testid="presenter"]').first().waitFor({ timeout: 20_000 });
            await ed.page.mouse.move(vp.width / 2, vp.height / 3);
          },
          () => drawnOverCaption(ed.page),
        )),
      );

      // A follower of the presentation: a viewer-link holder who follows the presenter.
      const fol = await context(browser, vp);
      problems.push(
        ...(await visit(
          fol.page,
          fol.w,
          vp.name,
          'follower',
          async () => {
            await fol.page.goto(d.viewer);
            await settle(fol.page);
            await fol.page.getByRole('button', { name: 'Follow presenter' }).first().click();
            await fol.page.locator('[data-testid="stage-caption"]').first().waitFor({ timeout: 20_000 }).catch(() => undefined);
          },
          () => drawnOverCaption(fol.page),
        )),
      );
      await ed.page.keyboard.press('Escape');

      problems.push(...anon.w.problems, ...ed.w.problems, ...fol.w.problems);
      for (const c of [anon, ed, fol]) await c.ctx.close();
      expect(problems).toEqual([]);
    },
    600_000,
  );
}
