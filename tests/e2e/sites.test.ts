/**
 * Finding a site in the browser: an editor creates a scene by searching a town (the answer fills name,
 * coordinates and zone), the 0°,0° confirmation, the team's sites panel, and an API token made on the
 * account page. Screenshots at three sizes go to tests/e2e/output/ (sites-*.png).
 */
import { expect } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();

async function signIn(page: Page, email: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO.password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((u) => u.pathname !== '/sign-in', { timeout: 30_000 });
}

browserTest('an editor creates a scene by searching a town', async () => {
  const browser = await world.browser();
  const { page, realErrors, cspViolations } = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  await signIn(page, DEMO.editor);
  // The title is typed while the form is still plain HTML: the island's script is held back until then,
  // so the test does not depend on timing. The form must keep the text once it hydrates.
  let release = () => {};
  const held = new Promise<void>((r) => (release = r));
  await page.route(/\/_astro\/SceneNew\.[\w-]+\.js$/, async (route) => {
    await held;
    await route.continue();
  });
  await page.goto('/scenes/new', { waitUntil: 'domcontentloaded' });
  const island = page.locator('astro-island[component-url*="/SceneNew."]');
  await page.getByLabel(/^Title/).fill('Night over La Serena');
  expect(await island.getAttribute('ssr'), 'the form must still be server-rendered HTML while the title is typed').not.toBeNull();
  expect(await page.getByRole('button', { name: 'Create scene' }).isDisabled()).toBe(true);
  release();
  await expect.poll(() => island.evaluate((el) => el.hasAttribute('ssr')), { timeout: 30_000 }).toBe(false);
  await page.unroute(/\/_astro\/SceneNew\.[\w-]+\.js$/);
  expect(await page.getByLabel(/^Title/).inputValue()).toBe('Night over La Serena');

  // A blank site first asks before using 0°, 0°.
  await page.getByRole('button', { name: 'Use this site' }).click();
  const check = page.getByRole('alertdialog', { name: 'Check the site' });
  await check.waitFor();
  expect(await check.textContent()).toMatch(/0°, 0°/);
  expect(await check.textContent()).toMatch(/no name/);
  await page.getByRole('button', { name: 'Go back' }).click();

  // Search as you type; accents not needed.
  const search = page.getByTestId('place-search');
  await search.fill('la seren');
  const option = page.getByRole('option').filter({ hasText: 'La Serena' }).first();
  await option.waitFor({ timeout: 10_000 });
  expect(await page.getByRole('option').first().textContent()).toMatch(/La Serena.*Chile/);
  await expect.poll(() => page.getByText(/Places from/).first().isVisible()).toBe(true);
  await screenshot(page, 'sites-search-1440x900');
  await option.click();

  // The answer filled the fields; the zone came from the coordinates (from memory: Chile keeps America/Santiago).
  await expect.poll(() => page.locator('input[name=name]').inputValue()).toBe('La Serena');
  expect(Number(await page.locator('input[name=lat]').inputValue())).toBeCloseTo(-29.9, 1);
  expect(Number(await page.locator('input[name=lon]').inputValue())).toBeCloseTo(-71.25, 1);
  expect(await page.locator('select[name=timeZone]').inputValue()).toBe('America/Santiago');
  expect(await page.getByText(/GeoNames gives no height/).count()).toBe(1);
  await page.locator('input[name=height]').fill('28');
  expect(await page.getByText('Height: Typed by you.').count()).toBe(1);

  // Moving the coordinates re-derives the zone (Tucson, Arizona: America/Phoenix, from memory).
  await page.locator('input[name=lat]').fill('32.22');
  await page.locator('input[name=lon]').fill('-110.93');
  await expect.poll(() => page.locator('select[name=timeZone]').inputValue(), { timeout: 10_000 }).toBe('America/Phoenix');
  // ...and back; a zone chosen by hand then stays.
  await page.locator('input[name=lat]').fill('-29.90');
  await page.locator('input[name=lon]').fill('-71.25');
  await expect.poll(() => page.locator('select[name=timeZone]').inputValue(), { timeout: 10_000 }).toBe('America/Santiago');
  await page.locator('select[name=timeZone]').selectOption('UTC');
  await page.locator('input[name=lon]').fill('-71.2500');
  await page.waitForTimeout(600);
  expect(await page.locator('select[name=timeZone]').inputValue()).toBe('UTC');
  await page.getByRole('button', { name: 'Take it from the coordinates again' }).click();
  await expect.poll(() => page.locator('select[name=timeZone]').inputValue(), { timeout: 10_000 }).toBe('America/Santiago');

  await page.getByRole('button', { name: 'Use this site' }).click();
  await page.getByText('Site set: La Serena').waitFor();
  // The title typed before hydration is still there (it is not typed again).
  expect(await page.getByLabel(/^Title/).inputValue()).toBe('Night over La Serena');
  await screenshot(page, 'sites-new-scene-1440x900');
  await page.getByRole('button', { name: 'Create scene' }).click();
  await page.waitForURL((u) => /^\/scenes\/(?!new$)[^/]+$/.test(u.pathname), { timeout: 30_000 });
  const id = new URL(page.url()).pathname.split('/').pop()!;

  const r = await page.request.get(`/api/scenes/${id}`);
  const scene = (await r.json()).scene;
  expect(scene.title).toBe('Night over La Serena');
  expect(scene.site).toMatchObject({ name: 'La Serena', height: 28, timeZone: 'America/Santiago' });
  expect(scene.site.lat).toBeCloseTo(-29.9, 1);
  expect(realErrors()).toEqual([]);
  expect(cspViolations()).toEqual([]);
});

browserTest('team sites panel, calendar subscription and API tokens, at three screen sizes', async () => {
  const browser = await world.browser();
  for (const [w, h] of [
    [1440, 900],
    [1920, 1080],
    [390, 844],
  ] as const) {
    const { page, realErrors } = await newPage(browser, { baseURL: world.url, viewport: { width: w, height: h } });
    await signIn(page, DEMO.owner);
    await page.goto('/dashboard');
    // the panel hydrates when it scrolls into view: click until the form opens
    await expect
      .poll(async () => {
        if (await page.getByTestId('place-search').isVisible()) return true;
        await page.getByRole('button', { name: 'Add a site' }).click();
        return page.getByTestId('place-search').isVisible();
      }, { timeout: 20_000 })
      .toBe(true);
    await page.getByTestId('place-search').fill('coonabar');
    await page.getByRole('option').filter({ hasText: 'Coonabarabran' }).first().click();
    await expect.poll(() => page.locator('select[name=timeZone]').inputValue()).toBe('Australia/Sydney');
    await page.locator('input[name=height]').fill('1165');
    await screenshot(page, `sites-team-${w}x${h}`);
    await page.getByRole('button', { name: 'Save this site' }).click();
    await page.getByText('Saved “Coonabarabran”.').waitFor();
    await page.getByRole('button', { name: /Make a subscription address|Replace with a new address/ }).click();
    await page.getByTestId('calendar-url').waitFor();
    expect(await page.locator('#calendar-url').inputValue()).toMatch(/\/api\/calendars\/[A-Za-z0-9_-]{43}\.ics$/);
    await screenshot(page, `sites-dashboard-${w}x${h}`);

    await page.goto('/account');
    await page.getByLabel('Name', { exact: true }).last().fill(`Schedule export ${w}`);
    await page.getByLabel('Scope').selectOption('read');
    await page.getByRole('button', { name: 'Make a token' }).click();
    await page.getByTestId('new-token').waitFor();
    const secret = await page.getByTestId('new-token').locator('input').inputValue();
    expect(secret).toMatch(/^arm_/);
    const me = await fetch(`${world.url}/api/me`, { headers: { authorization: `Bearer ${secret}` } });
    expect((await me.json()).user.email).toBe(DEMO.owner);
    await page.reload();
    await page.getByRole('cell', { name: `Schedule export ${w}`, exact: true }).waitFor();
    expect(await page.content()).not.toContain(secret);
    await screenshot(page, `sites-account-${w}x${h}`);
    expect(realErrors()).toEqual([]);
    await page.context().close();
  }
});
