/**
 * What a page loads before the sky's first frame, as the DevTools protocol sees it: every response
 * finished by then, with its type, URL and encoded length (headers and body as received). The frame time is
 * `__armillaStats.firstFrameAt` (performance.now() of the first WebGL frame, counted from navigation).
 * A size, not a time: a slower machine can only move files past the first frame, never before it.
 * Used by the viewer-link benchmark and the browser test of the 400 kB budget (no vitest import here).
 */
import type { BrowserContext, CDPSession, Page } from 'playwright-core';

export interface LoadedFile {
  requestId: string;
  url: string;
  type: string;
  encoding: string;
  bytes: number;
}

export interface FirstFrameLoad {
  firstFrameMs: number;
  /** Responses finished before the first frame. */
  before: LoadedFile[];
  /** The page's DevTools session, still open (e.g. for Network.getResponseBody). */
  cdp: CDPSession;
}

/** Navigates `page` to `url` and waits (up to 60 s) for the sky's first frame. */
export async function loadToFirstFrame(context: BrowserContext, page: Page, url: string): Promise<FirstFrameLoad> {
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  const seen = new Map<string, { url: string; type: string; encoding: string }>();
  const done: { id: string; at: number; bytes: number }[] = [];
  let t0: number | null = null;
  cdp.on('Network.requestWillBeSent', (e) => {
    if (t0 === null && e.type === 'Document') t0 = e.timestamp;
  });
  cdp.on('Network.responseReceived', (e) => {
    const h = Object.fromEntries(Object.entries(e.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]));
    seen.set(e.requestId, { url: e.response.url, type: e.type, encoding: h['content-encoding'] ?? 'identity' });
  });
  cdp.on('Network.loadingFinished', (e) => done.push({ id: e.requestId, at: e.timestamp, bytes: e.encodedDataLength }));
  await page.goto(url);
  await page.waitForFunction(() => (window as unknown as { __armillaStats?: { firstFrameAt: number | null } }).__armillaStats?.firstFrameAt != null, null, { timeout: 60_000 });
  const firstFrameMs = await page.evaluate(() => (window as unknown as { __armillaStats: { firstFrameAt: number } }).__armillaStats.firstFrameAt);
  const by = t0! + firstFrameMs / 1000 + 0.005;
  const before = done
    .filter((d) => d.at <= by && seen.has(d.id))
    .map((d) => ({ requestId: d.id, bytes: d.bytes, ...seen.get(d.id)! }));
  return { firstFrameMs, before, cdp };
}
