/**
 * The new-scene form keeps a title typed before its island hydrated. The island's script is held back
 * (the request waits) until the title has been typed into the server-rendered field, so the typing surely
 * comes first; once the form is live the title is still there and the scene is created with it.
 */
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage } from './helpers/browser';

const world = e2eWorld();

browserTest('a title typed before the new-scene form hydrated is kept', async () => {
  const browser = await world.browser();
  const { page, context, realErrors } = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 900 } });
  expect((await context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } })).status()).toBe(200);

  // hold every script until the title is typed
  let release!: () => void;
  const typed = new Promise<void>((r) => (release = r));
  await page.route(/\/_astro\/.*\.js(\?.*)?$/, async (route) => {
    await typed;
    await route.continue();
  });
  await page.goto('/scenes/new', { waitUntil: 'domcontentloaded' });
  const title = page.locator('input[name=title]');
  await title.waitFor();
  await title.pressSequentially('Typed before hydration');
  release();

  // hydrated (Astro drops the island's `ssr` mark), and the site form answers: its button works only once React runs
  await page.waitForFunction(() => document.querySelector('astro-island') !== null && document.querySelector('astro-island[ssr]') === null, undefined, { timeout: 30_000 });
  await page.getByRole('button', { name: 'Use this site' }).click();
  await page.getByRole('alertdialog', { name: 'Check the site' }).waitFor({ timeout: 30_000 });
  await page.getByRole('button', { name: 'Go back' }).click();
  expect(await title.inputValue()).toBe('Typed before hydration');

  // and the title reaches the server
  await page.locator('input[name=name]').fill('Hydration test site');
  await page.locator('input[name=lat]').fill('37.2');
  await page.locator('input[name=lon]').fill('-3.6');
  await page.getByRole('button', { name: 'Use this site' }).click();
  await page.getByText('Site set: Hydration test site').waitFor();
  await page.getByRole('button', { name: 'Create scene' }).click();
  await page.waitForURL((u) => /^\/scenes\/(?!new$)[^/]+$/.test(u.pathname), { timeout: 30_000 });
  const id = new URL(page.url()).pathname.split('/').pop()!;
  const scene = await (await context.request.get(`/api/scenes/${id}`)).json();
  expect(scene.scene.title).toBe('Typed before hydration');
  expect(realErrors()).toEqual([]);
});
