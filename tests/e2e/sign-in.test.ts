/** Signing in through the UI as the demo owner reaches the dashboard (islands hydrate under our CSP). */
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();

browserTest('a signed-out visit to /dashboard lands on sign-in; signing in as the demo owner reaches the dashboard', async () => {
  const browser = await world.browser();
  const { page, context, realErrors, cspViolations } = await newPage(browser, { baseURL: world.url });

  await page.goto('/dashboard');
  expect(new URL(page.url()).pathname).toBe('/sign-in');
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();

  // The form is a React island: if the CSP blocked hydration, submitting would not call the API.
  await page.getByLabel('E-mail').fill(DEMO.owner);
  await page.getByLabel('Password').fill(DEMO.password);
  await screenshot(page, 'sign-in-form');
  await page.getByRole('button', { name: 'Sign in' }).click();

  await page.waitForURL('**/dashboard', { timeout: 15_000 });
  await page.getByRole('heading', { level: 1, name: 'Larkspur Ridge Observatory' }).waitFor();
  const members = page.getByRole('list', { name: 'Team members' });
  await members.waitFor();
  await expect.poll(() => members.getByRole('listitem').count()).toBe(4);
  await page.getByRole('form', { name: 'Invite someone' }).waitFor();
  await page.getByRole('heading', { name: 'Scenes' }).waitFor();
  await page.waitForLoadState('networkidle');
  await screenshot(page, 'dashboard-owner');

  const cookies = await context.cookies();
  const session = cookies.find((c) => c.name === 'armilla_session');
  expect(session?.httpOnly).toBe(true);
  expect(cspViolations()).toEqual([]);
  expect(realErrors()).toEqual([]);
});

browserTest('keyboard only: the skip link and the sign-in form are reachable with Tab, and focus is visible', async () => {
  const browser = await world.browser();
  const { page } = await newPage(browser, { baseURL: world.url, viewport: { width: 390, height: 844 } });
  await page.goto('/sign-in');
  await page.keyboard.press('Tab');
  const first = await page.evaluate(() => document.activeElement?.textContent?.trim());
  expect(first).toBe('Skip to content');
  const outline = await page.evaluate(() => getComputedStyle(document.activeElement as Element).outlineStyle);
  expect(outline).not.toBe('none');
  await page.getByLabel('E-mail').focus();
  await page.keyboard.type(DEMO.viewer);
  await page.keyboard.press('Tab');
  await page.keyboard.type(DEMO.password);
  await page.keyboard.press('Enter');
  await page.waitForURL('**/dashboard', { timeout: 15_000 });
  await screenshot(page, 'dashboard-viewer-mobile');
  // Viewers see the members but no invite form.
  await page.getByRole('list', { name: 'Team members' }).waitFor();
  expect(await page.getByRole('form', { name: 'Invite someone' }).count()).toBe(0);
});
