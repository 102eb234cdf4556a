/**
 * The scene workflow end to end in headless Chromium (SwiftShader, no GPU): an editor signs in, builds a
 * scene with a pin and a step, shares a reviewer link; a guest opens it and comments on a point of the
 * sky; the editor sees the comment (and its marker) and resolves it. Screenshots go to tests/e2e/output/.
 */
import { expect } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();

/** Clicks empty sky (not a star) until `done` appears: picks land on the first click that misses every object. */
async function clickSky(page: Page, done: () => Promise<boolean>) {
  const canvas = page.locator('[data-testid=sky] canvas').first();
  await canvas.waitFor();
  const box = (await canvas.boundingBox())!;
  const spots = [
    [0.5, 0.25], [0.3, 0.3], [0.7, 0.2], [0.4, 0.15], [0.6, 0.35], [0.25, 0.4], [0.8, 0.3], [0.55, 0.1],
  ];
  for (const [fx, fy] of spots) {
    await page.mouse.click(box.x + box.width * fx!, box.y + box.height * fy!);
    await page.waitForTimeout(250);
    if (await done()) return;
  }
  throw new Error('no click on the sky produced a pick');
}

browserTest('editor builds and shares a scene; a guest reviewer comments on the sky; the editor resolves it', async () => {
  const browser = await world.browser();
  const editor = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 1000 } });
  const { page } = editor;

  // Sign in.
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(DEMO.editor);
  await page.getByLabel('Password').fill(DEMO.password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((u) => u.pathname !== '/sign-in', { timeout: 30_000 });
  await page.goto('/scenes/new');

  // Create a scene from one of the team's sites.
  await page.getByLabel('One of the team’s sites').check();
  await page.getByLabel(/^Title/).fill('Workflow test scene');
  const siteSelect = page.getByLabel('Site', { exact: true });
  await expect.poll(async () => await siteSelect.locator('option').count(), { timeout: 10_000 }).toBeGreaterThan(1);
  await siteSelect.selectOption({ index: 1 });
  await page.getByRole('button', { name: 'Create scene' }).click();
  await page.waitForURL((u) => /^\/scenes\/(?!new$)[^/]+$/.test(u.pathname), { timeout: 30_000 });
  const sceneUrl = page.url();
  await page.getByTestId('scene-title').waitFor();
  await page.locator('[data-testid=sky] canvas').first().waitFor({ timeout: 30_000 });

  // A label pin placed by clicking on the sky.
  await page.locator('summary', { hasText: /^Pins/ }).click();
  await page.getByRole('button', { name: 'Place a pin on the sky' }).click();
  await page.getByLabel('Label', { exact: true }).fill('Look here');
  const addPin = page.getByRole('button', { name: 'Add pin' });
  await clickSky(page, () => addPin.isEnabled());
  await addPin.click();
  await expect.poll(() => page.locator('[data-save-status]').getAttribute('data-save-status'), { timeout: 15_000 }).toBe('saved');

  // A step with a caption.
  await page.getByRole('tab', { name: /^Steps/ }).click();
  await page.getByRole('button', { name: 'Add step' }).click();
  await page.getByLabel(/^Caption/).fill('The **celestial equator** meets the horizon at east and west.');
  await page.getByLabel('Focus on a pin').selectOption({ label: 'Look here' });
  await page.getByRole('button', { name: 'Save step' }).click();
  await expect.poll(() => page.locator('[data-save-status]').getAttribute('data-save-status'), { timeout: 15_000 }).toBe('saved');
  await screenshot(page, 'workflow-1-editor-scene');

  // Share a reviewer link.
  await page.getByRole('tab', { name: 'Share' }).click();
  await page.getByLabel('Role').selectOption('reviewer');
  await page.getByRole('button', { name: 'Create link' }).click();
  const link = await page.getByTestId('new-link-url').inputValue();
  expect(link).toMatch(/\/s\/[A-Za-z0-9_-]{20,}$/);

  // A guest opens the link and comments on a point of the sky.
  const guest = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 1000 } });
  await guest.page.goto(new URL(link).pathname);
  try {
    await guest.page.getByRole('heading', { name: 'Workflow test scene' }).waitFor();
  } catch (e) {
    await screenshot(guest.page, 'workflow-guest-failed');
    throw new Error(`guest page did not show the scene: ${guest.errors.join(' | ')}\n${(await guest.page.locator('body').innerText()).slice(0, 500)}`);
  }
  await guest.page.getByRole('tab', { name: 'Comments' }).click();
  await guest.page.getByLabel(/^Your name/).fill('Guest Reviewer');
  await guest.page.getByLabel('Comment', { exact: true }).fill('Is the pin *above* the envelope floor?');
  await guest.page.getByRole('button', { name: 'Pick a point on the sky' }).click();
  await clickSky(guest.page, () => guest.page.getByTestId('comment-anchor').isVisible());
  expect(await guest.page.getByTestId('comment-anchor').innerText()).toContain('RA');
  await guest.page.getByRole('button', { name: 'Post comment' }).click();
  await guest.page.getByTestId('comment').first().waitFor();
  await screenshot(guest.page, 'workflow-2-guest-comment');
  expect(guest.realErrors()).toEqual([]);

  // The editor sees it (with its sky marker) and resolves it.
  await expect.poll(() => page.locator('[data-save-status]').getAttribute('data-save-status'), { timeout: 15_000 }).toBe('saved');
  page.on('dialog', (d) => void d.accept());
  await page.goto(sceneUrl);
  try {
    await page.getByRole('tab', { name: /^Review/ }).click({ timeout: 60_000 });
  } catch (e) {
    await screenshot(page, 'workflow-editor-reload-failed');
    throw new Error(`editor page after reload: ${editor.errors.join(' | ')}\n${(await page.locator('main').innerText()).slice(0, 400)}`);
  }
  const comment = page.getByTestId('comment').first();
  await comment.waitFor();
  expect(await comment.innerText()).toContain('Guest Reviewer');
  expect(await comment.innerText()).toContain('RA');
  await page.waitForTimeout(500);
  await screenshot(page, 'workflow-3-editor-sees-marker');
  await comment.getByRole('button', { name: 'Resolve' }).click();
  await expect.poll(() => page.getByTestId('comment').count()).toBe(0);
  await page.getByRole('radio', { name: 'Resolved' }).click();
  await page.getByTestId('comment').first().waitFor();
  expect(await page.getByTestId('comment').first().getAttribute('data-resolved')).toBe('true');
  await screenshot(page, 'workflow-4-resolved');
  expect(editor.realErrors()).toEqual([]);
}, 300_000);
