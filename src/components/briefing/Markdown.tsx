/** Renders the safe Markdown subset as React elements: no innerHTML anywhere. */
import { Fragment, type ReactNode } from 'react';
import { parseMarkdown, type Inline } from '../../lib/markdown';

function inline(nodes: Inline[]): ReactNode[] {
  return nodes.map((n, i) => {
    switch (n.t) {
      case 'text':
        return <Fragment key={i}>{n.v}</Fragment>;
      case 'br':
        return <br key={i} />;
      case 'code':
        return (
          <code key={i} className="rounded bg-ink-800 px-1 font-mono text-[0.9em]">
            {n.v}
          </code>
        );
      case 'strong':
        return <strong key={i}>{inline(n.c)}</strong>;
      case 'em':
        return <em key={i}>{inline(n.c)}</em>;
      case 'link':
        return (
          <a key={i} href={n.href} rel="noopener noreferrer nofollow" target="_blank" className="text-brass-300 underline hover:text-brass-200">
            {inline(n.c)}
          </a>
        );
    }
  });
}

export function Markdown({ source, className = '' }: { source: string; className?: string }) {
  const blocks = parseMarkdown(source);
  return (
    <div className={`flex flex-col gap-2 leading-relaxed ${className}`}>
      {blocks.map((b, i) =>
        b.t === 'p' ? (
          <p key={i}>{inline(b.c)}</p>
        ) : b.t === 'h' ? (
          b.level === 1 ? (
            <h3 key={i} className="text-lg font-semibold">{inline(b.c)}</h3>
          ) : b.level === 2 ? (
            <h4 key={i} className="text-base font-semibold">{inline(b.c)}</h4>
          ) : (
            <h5 key={i} className="text-sm font-semibold uppercase tracking-wide">{inline(b.c)}</h5>
          )
        ) : b.t === 'ul' ? (
          <ul key={i} className="list-disc pl-5">
            {b.items.map((it, k) => (
              <li key={k}>{inline(it)}</li>
            ))}
          </ul>
        ) : (
          <ol key={i} start={b.start} className="list-decimal pl-5">
            {b.items.map((it, k) => (
              <li key={k}>{inline(it)}</li>
            ))}
          </ol>
        ),
      )}
    </div>
  );
}
