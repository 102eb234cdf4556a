/**
 * Briefing presenter and follow mode in the browser: an editor presents the demo equinox briefing, a
 * viewer-link holder follows it, and each step the presenter moves to reaches the follower's page
 * (server-sent events; the presenter's state lives in the database).
 */
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();

browserTest('an editor presents the briefing; a viewer link follows step by step', async () => {
  const browser = await world.browser();
  const editor = await newPage(browser, { baseURL: world.url, viewport: { width: 1280, height: 800 } });
  const signIn = await editor.context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } });
  expect(signIn.status()).toBe(200);
  const list = await (await editor.context.request.get('/api/scenes')).json();
  const scene = list.scenes.find((s: { title: string }) => s.title === 'Equinox evening briefing');
  expect(scene).toBeTruthy();
  const link = await editor.context.request.post(`/api/scenes/${scene.id}/links`, { data: { role: 'viewer' } });
  expect(link.status()).toBe(201);
  const { url } = await link.json();

  // The follower: no account, only the link.
  const guest = await newPage(browser, { viewport: { width: 1280, height: 800 } });
  await guest.page.goto(url);
  await guest.page.getByRole('button', { name: 'Follow presenter' }).click();
  await expect.poll(() => guest.page.getByText('Following the presenter').count(), { timeout: 20_000 }).toBeGreaterThan(0);

  // The presenter starts at step 1 ("The local horizon", seeded caption heading "Where we stand").
  await editor.page.goto(`/scenes/${scene.id}`);
  await editor.page.getByRole('tab', { name: /Steps/ }).click();
  await editor.page.getByRole('button', { name: 'Present', exact: true }).click();
  const presenter = editor.page.getByTestId('presenter');
  await expect.poll(() => presenter.getByText('Step 1 of 5').count(), { timeout: 20_000 }).toBe(1);
  await expect.poll(() => guest.page.getByText('Where we stand').count(), { timeout: 20_000 }).toBeGreaterThan(0);

  // Keyboard → next step; the follower's page shows step 2's caption.
  await presenter.focus();
  await editor.page.keyboard.press('ArrowRight');
  await expect.poll(() => presenter.getByText('Step 2 of 5').count(), { timeout: 10_000 }).toBe(1);
  await expect.poll(() => guest.page.getByText('Tilted by our latitude').count(), { timeout: 20_000 }).toBeGreaterThan(0);
  // Step 2 is told from outside the sphere (seeded camera mode 'sphere'): the follower's stage switches too.
  const followerSky = guest.page.getByTestId('audience-stage').getByTestId('sky-view');
  await expect.poll(() => followerSky.getAttribute('data-mode'), { timeout: 10_000 }).toBe('sphere');
  await screenshot(editor.page, 'presenter-editor');
  await screenshot(guest.page, 'presenter-follower');

  // Escape leaves the presenter.
  await editor.page.keyboard.press('Escape');
  await expect.poll(() => editor.page.getByTestId('presenter').count(), { timeout: 10_000 }).toBe(0);
  expect(editor.realErrors()).toEqual([]);
  expect(guest.realErrors()).toEqual([]);
});
