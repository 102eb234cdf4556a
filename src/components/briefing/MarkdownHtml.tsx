/** The rendered Markdown: HTML from src/lib/markdown, which escapes all typed text and allows only the subset's tags. */
import { useMemo } from 'react';
import { markdownToText, renderMarkdown } from '../../lib/markdown';
import { MD_BOX } from './markdown-box';

export default function MarkdownHtml({ source, className }: { source: string; className: string }) {
  const html = useMemo(() => renderMarkdown(source), [source]);
  return <div className={`armilla-md ${MD_BOX} ${className}`} dangerouslySetInnerHTML={{ __html: html }} />;
}

export function MarkdownPlain({ source }: { source: string }) {
  return <>{markdownToText(source)}</>;
}
