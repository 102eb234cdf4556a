/**
 * Shared browser helper for e2e tests: Debian's headless Chromium through playwright-core, software
 * rendering only (no GPU). Outside CI the browser tests skip when /usr/bin/chromium is missing; under
 * CI=true they run anyway and fail at launch, so a missing browser can never pass silently.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, test } from 'vitest';
import { startServer, type StartOptions, type TestServer } from '../../integration/helpers/server';

export const CHROMIUM_PATH = '/usr/bin/chromium';
export const OUTPUT_DIR = resolve('tests/e2e/output');

export const chromiumAvailable = existsSync(CHROMIUM_PATH);
/** `browserTest(...)` in place of `test(...)`: skipped only when the browser is absent and not in CI. */
export const browserTest = chromiumAvailable || process.env.CI === 'true' ? test : test.skip;

/** Software WebGL (SwiftShader through ANGLE): no GPU anywhere. The rest keeps Chromium off the network. */
export const BROWSER_ARGS = [
  '--no-sandbox',
  '--use-gl=angle',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export async function launch(): Promise<Browser> {
  if (!chromiumAvailable) throw new Error(`${CHROMIUM_PATH} is missing: install Debian's chromium (apt-get install -y chromium)`);
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: BROWSER_ARGS,
  });
}

/**
 * Init script for a browser context: every `securitypolicyviolation` event becomes a console error
 * ("Content Security Policy violation: …"), so a script of ours that the CSP blocks fails the test
 * (init scripts run outside the page's CSP).
 */
export function reportCspViolations(): void {
  document.addEventListener('securitypolicyviolation', (e) => {
    console.error(`Content Security Policy violation: ${e.effectiveDirective} blocked ${e.blockedURI || 'an inline script'} at ${e.sourceFile}:${e.lineNumber} (${e.sample})`);
  });
}

export interface CapturedPage {
  page: Page;
  context: BrowserContext;
  /** console.error lines and uncaught page errors, in order. */
  errors: string[];
  /** Errors other than failed network loads (a 4xx answer logs "Failed to load resource"). */
  realErrors: () => string[];
  /** Content-Security-Policy violations reported by the browser. */
  cspViolations: () => string[];
}

export async function newPage(browser: Browser, opts: { baseURL?: string; viewport?: { width: number; height: number } } = {}): Promise<CapturedPage> {
  const context = await browser.newContext({
    ...(opts.baseURL ? { baseURL: opts.baseURL } : {}),
    viewport: opts.viewport ?? { width: 1280, height: 800 },
    colorScheme: 'dark',
  });
  await context.addInitScript(reportCspViolations);
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  return {
    page,
    context,
    errors,
    realErrors: () => errors.filter((e) => !/^Failed to load resource/.test(e)),
    cspViolations: () => errors.filter((e) => /Content Security Policy/i.test(e)),
  };
}

/** Saves a full-page PNG under tests/e2e/output/ and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(OUTPUT_DIR, { recursive: true });
  const path = join(OUTPUT_DIR, name.endsWith('.png') ? name : `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}

/**
 * One test file's world: the built app on its own port and database (started before the file's tests),
 * and one browser launched on first use; both are closed after the file.
 */
export function e2eWorld(opts: StartOptions = {}) {
  let server: TestServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    server = await startServer(opts);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  return {
    get server(): TestServer {
      if (!server) throw new Error('the test server has not started');
      return server;
    },
    get url(): string {
      return this.server.url;
    },
    browser: async (): Promise<Browser> => (browser ??= await launch()),
  };
}
