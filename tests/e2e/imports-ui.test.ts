/**
 * The import and export UI end to end in headless Chromium (SwiftShader, no GPU): the demo editor opens the
 * pointing-review scene, previews a target list with a bad row (error shown, import refused), imports a good
 * one (the list grows, autosave carries on without a conflict), imports a horizon mask after checking its
 * skyline, and finds the export links. Screenshots go to tests/e2e/output/.
 */
import { expect } from 'vitest';
import { DEMO } from '../integration/helpers/client';
import { browserTest, e2eWorld, newPage, screenshot } from './helpers/browser';

const world = e2eWorld();

const csv = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });

// Invented fields; RA 25 h is out of range (RA runs 0–24 h), so line 3 must be refused.
const BAD = 'name,ra,dec,notes\nTest field P-1 (invented),14 15 39.7,+19 10 57,first\nTest field P-2 (invented),25h00m00s,+10,out of range\n';
const GOOD = 'name,ra,dec,notes\nTest field P-1 (invented),14 15 39.7,+19 10 57,first\nTest field P-2 (invented),14h00m00s,+10,fixed\n';
// A skyline with a 10 m wall 20 m away to the west: atan(10/20) = 26.57° (domain-facts.md, derived).
const HORIZON = 'azimuth,elevation\n0,6\n90,4\n180,8\n250,26.57\n290,26.57\n330,10\n';

browserTest('editor previews and imports a target list, imports a horizon mask with a skyline preview, finds the exports', async () => {
  const browser = await world.browser();
  const { page, errors } = await newPage(browser, { baseURL: world.url, viewport: { width: 1440, height: 1000 } });

  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(DEMO.editor);
  await page.getByLabel('Password').fill(DEMO.password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((u) => u.pathname !== '/sign-in', { timeout: 30_000 });
  await page.goto('/dashboard');
  await page.getByRole('link', { name: '0.6 m pointing review' }).first().click();
  await page.waitForURL((u) => /^\/scenes\/[^/]+$/.test(u.pathname), { timeout: 30_000 });
  await page.getByTestId('scene-title').waitFor();
  const status = () => page.locator('[data-save-status]').getAttribute('data-save-status');
  const versionText = async () => (await page.locator('[data-save-status]').textContent()) ?? '';
  const v0 = Number(/v(\d+)/.exec(await versionText())![1]);

  // Targets: the accepted forms are stated; the bad file is previewed and refused.
  await page.locator('summary', { hasText: /^Targets/ }).click();
  const targets = page.getByRole('list', { name: 'Targets' }).locator('li');
  const before = await targets.count();
  const box = page.getByTestId('targets-import');
  await expect.poll(() => box.textContent()).toMatch(/14h15m39\.7s/);
  await expect.poll(() => box.textContent()).toMatch(/5 MB/);
  await page.getByLabel('Target list file').setInputFiles(csv('targets-bad.csv', BAD));
  const table = page.getByTestId('targets-preview');
  await table.waitFor({ timeout: 15_000 });
  const badRow = table.locator('tr[data-row-ok=false]');
  await expect.poll(() => badRow.count()).toBe(1);
  expect(await badRow.locator('td').first().textContent()).toBe('3');
  expect(await badRow.textContent()).toMatch(/ra/);
  const importBtn = page.getByRole('button', { name: 'Import 2 targets' });
  expect(await importBtn.isDisabled()).toBe(true);
  await screenshot(page, 'imports-ui-targets-bad');
  expect(await targets.count()).toBe(before);

  // The fixed file: all rows good, import, the list grows by two.
  await page.getByLabel('Target list file').setInputFiles(csv('targets-good.csv', GOOD));
  await expect.poll(() => table.locator('tr[data-row-ok=false]').count(), { timeout: 15_000 }).toBe(0);
  await expect.poll(() => importBtn.isEnabled()).toBe(true);
  await importBtn.click();
  await expect.poll(() => targets.count(), { timeout: 15_000 }).toBe(before + 2);
  await expect.poll(() => box.textContent()).toMatch(/Imported 2 targets/);
  await expect.poll(async () => Number(/v(\d+)/.exec(await versionText())![1])).toBeGreaterThan(v0);
  expect(await status()).toBe('saved');

  // An edit after the import saves on top of the new version (no conflict).
  await page.getByLabel('Description', { exact: true }).fill('Imported targets checked in the browser test.');
  await expect.poll(status, { timeout: 15_000 }).toBe('saved');

  // Horizon mask of the team envelope: choose a file, see the skyline, confirm.
  await page.locator('summary', { hasText: /^Envelope/ }).click();
  await page.getByRole('button', { name: 'Import horizon mask…' }).click();
  await page.getByLabel('Azimuth in the file is measured').selectOption('north-east');
  await page.getByLabel('Horizon mask file').setInputFiles(csv('horizon.csv', HORIZON));
  const line = page.getByTestId('horizon-import').locator('[data-testid=skyline-line]');
  await line.waitFor({ timeout: 10_000 });
  const d = (await line.getAttribute('d')) ?? '';
  expect(d.startsWith('M0 ')).toBe(true);
  expect(d.split('L').length).toBe(7); // north, 5 points after north, and north again at 360°
  expect(await page.getByTestId('horizon-import').locator('[data-testid=skyline-fill]').count()).toBe(1);
  await screenshot(page, 'imports-ui-horizon-preview');
  await page.getByRole('button', { name: 'Replace mask with 6 points' }).click();
  await expect.poll(() => page.getByTestId('horizon-import').textContent(), { timeout: 15_000 }).toMatch(/Horizon mask replaced: 6 points/);
  // The scene re-read from the server shows the new mask (6 points, not the seeded 12).
  await expect.poll(() => page.getByTestId('horizon-import').locator('svg title').first().textContent()).toMatch(/6 points/);

  // Export & print: the links are there for the view time.
  await page.locator('summary', { hasText: 'Export & print' }).click();
  const exp = page.getByTestId('export-panel');
  expect(await exp.getByRole('link', { name: 'Printable handout' }).getAttribute('href')).toMatch(/^\/scenes\/[^/]+\/handout$/);
  expect(await exp.getByRole('link', { name: /Targets at .* \(CSV\)/ }).getAttribute('href')).toMatch(/\/export\.csv\?time=2026-06-15T06%3A00%3A00Z$/);
  expect(await exp.getByRole('link', { name: 'Visibility windows (CSV)' }).getAttribute('href')).toMatch(/\/windows\.csv\?from=/);
  const json = await page.request.get((await exp.getByRole('link', { name: 'Scene file (JSON)' }).getAttribute('href'))!);
  expect(json.status()).toBe(200);
  const vot = await page.request.get((await exp.getByRole('link', { name: 'Targets (VOTable)' }).getAttribute('href'))!);
  expect(vot.status()).toBe(200);
  expect(await status()).not.toBe('conflict');
  await screenshot(page, 'imports-ui-done');

  // Import the exported scene file as a new scene from /scenes/new.
  await page.goto('/scenes/new');
  // A file chosen before the form's island hydrates is not seen by it (Astro drops `ssr` from an island once hydrated).
  await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));
  await page.getByLabel('Scene file', { exact: true }).setInputFiles({ name: 'scene.json', mimeType: 'application/json', buffer: Buffer.from(await json.body()) });
  await page.getByRole('button', { name: 'Import scene file' }).click();
  await page.waitForURL((u) => /^\/scenes\/(?!new$)[^/]+$/.test(u.pathname), { timeout: 30_000 });
  await page.getByTestId('scene-title').waitFor();
  expect(await page.getByTestId('scene-title').textContent()).toMatch(/0\.6 m pointing review/);

  expect(errors.filter((e) => e.startsWith('pageerror'))).toEqual([]);
}, 180_000);
