/**
 * Shows Markdown that people typed (captions, descriptions, comments) with the subset and sanitiser of
 * src/lib/markdown. The renderer is a chunk of its own, fetched the first time a Markdown text is shown
 * (or ahead of that with `preloadMarkdown`, e.g. once the sky has drawn its first frame): a viewer link's
 * first frame does not wait for it. Until it has arrived the text shows as typed.
 */
import { lazy, Suspense } from 'react';
import { MD_BOX } from './markdown-box';

const load = () => import('./MarkdownHtml');
const MarkdownHtml = lazy(load);
const MarkdownPlain = lazy(() => load().then((m) => ({ default: m.MarkdownPlain })));

/** Starts fetching the renderer before a Markdown text is on screen. */
export function preloadMarkdown(): void {
  void load();
}

export function Markdown({ source, className = '' }: { source: string; className?: string }) {
  return (
    <Suspense fallback={<div className={`${MD_BOX} whitespace-pre-wrap ${className}`}>{source}</div>}>
      <MarkdownHtml source={source} className={className} />
    </Suspense>
  );
}

/** The plain text of a Markdown text (for one-line previews); as typed until the renderer has arrived. */
export function MarkdownText({ source }: { source: string }) {
  return (
    <Suspense fallback={source}>
      <MarkdownPlain source={source} />
    </Suspense>
  );
}
