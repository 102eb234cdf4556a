/**
 * A deliberately tiny Markdown subset for captions and comments: paragraphs, **bold**, *italic*, `code`,
 * bullet and numbered lists, and [links](https://…) with http(s) targets only.
 * Raw HTML is never passed through: the parser yields a small tree of text nodes; `renderMarkdown` escapes
 * every character of text and attribute, and the React view builds elements from the tree (no innerHTML).
 * Pure: no DOM, no React.
 */

export type Inline =
  | { t: 'text'; v: string }
  | { t: 'strong'; c: Inline[] }
  | { t: 'em'; c: Inline[] }
  | { t: 'code'; v: string }
  | { t: 'link'; href: string; c: Inline[] }
  | { t: 'br' };

export type Block = { t: 'h'; level: 1 | 2 | 3; c: Inline[] } | { t: 'p'; c: Inline[] } | { t: 'ul'; items: Inline[][] } | { t: 'ol'; start: number; items: Inline[][] };

const MAX_INPUT = 20_000;
const MAX_DEPTH = 8;

/** Returns a normalised http(s) URL, or null for anything else (javascript:, data:, relative, malformed). */
export function safeHref(raw: string): string | null {
  const s = raw.trim();
  // Control characters and whitespace inside a URL are a classic way to smuggle a scheme past a check.
  if (!s || /[\u0000-\u0020\u007f-\u009f<>"'`\\]/.test(s)) return null;
  if (!/^https?:\/\//i.test(s)) return null;
  try {
    const u = new URL(s);
    if (u.protocol !== 'http:' && u.protocol !== 'https:') return null;
    if (!u.hostname) return null;
    return u.href;
  } catch {
    return null;
  }
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function pushText(out: Inline[], v: string) {
  if (!v) return;
  const last = out[out.length - 1];
  if (last && last.t === 'text') last.v += v;
  else out.push({ t: 'text', v });
}

/** Finds the closing delimiter `d` at or after `from`, skipping backslash escapes; -1 when absent. */
function findClose(s: string, d: string, from: number): number {
  for (let i = from; i < s.length; i++) {
    if (s[i] === '\\') {
      i++;
      continue;
    }
    if (s.startsWith(d, i)) {
      if (d === '*' && s[i + 1] === '*') {
        // `**` inside an emphasis opens bold: skip over the bold run.
        const j = findClose(s, '**', i + 2);
        if (j < 0) return -1;
        i = j + 1;
        continue;
      }
      return i;
    }
  }
  return -1;
}

export function parseInline(s: string, depth = 0): Inline[] {
  const out: Inline[] = [];
  if (depth > MAX_DEPTH) {
    pushText(out, s);
    return out;
  }
  let i = 0;
  while (i < s.length) {
    const c = s[i]!;
    if (c === '\\' && i + 1 < s.length && /[\\`*_[\]()#+\-.!>]/.test(s[i + 1]!)) {
      pushText(out, s[i + 1]!);
      i += 2;
      continue;
    }
    if (c === '`') {
      const j = s.indexOf('`', i + 1);
      if (j > i + 1) {
        out.push({ t: 'code', v: s.slice(i + 1, j) });
        i = j + 1;
        continue;
      }
    }
    if (c === '*' && s[i + 1] === '*') {
      const j = findClose(s, '**', i + 2);
      if (j > i + 2) {
        out.push({ t: 'strong', c: parseInline(s.slice(i + 2, j), depth + 1) });
        i = j + 2;
        continue;
      }
    }
    if ((c === '*' || c === '_') && s[i + 1] !== c && s[i + 1] !== ' ' && s[i + 1] !== undefined) {
      // `_` only opens at a word boundary, so snake_case names stay as typed.
      if (c === '*' || i === 0 || /[\s(]/.test(s[i - 1]!)) {
        const j = findClose(s, c, i + 1);
        if (j > i + 1 && s[j - 1] !== ' ') {
          out.push({ t: 'em', c: parseInline(s.slice(i + 1, j), depth + 1) });
          i = j + 1;
          continue;
        }
      }
    }
    if (c === '[') {
      const close = findClose(s, ']', i + 1);
      if (close > i && s[close + 1] === '(') {
        let end = -1;
        for (let k = close + 2, depth = 0; k < s.length; k++) {
          if (s[k] === '(') depth++;
          else if (s[k] === ')' && depth-- === 0) {
            end = k;
            break;
          }
        }
        if (end > close) {
          const label = s.slice(i + 1, close);
          const href = safeHref(s.slice(close + 2, end));
          if (href) out.push({ t: 'link', href, c: parseInline(label, depth + 1) });
          // An unsafe target keeps its label as plain text and drops the URL.
          else pushText(out, label);
          i = end + 1;
          continue;
        }
      }
    }
    pushText(out, c);
    i++;
  }
  return out;
}

const UL = /^\s{0,3}[-*+]\s+(.*)$/;
const OL = /^\s{0,3}(\d{1,9})[.)]\s+(.*)$/;

/** ATX headings `#` … `######` (levels past 3 render as level 3). */
const HEADING = /^\s{0,3}(#{1,6})\s+(.*?)\s*#*\s*$/;

export function parseMarkdown(src: string): Block[] {
  const text = String(src ?? '').slice(0, MAX_INPUT).replace(/\r\n?/g, '\n');
  const blocks: Block[] = [];
  let para: string[] = [];
  let list: { t: 'ul' | 'ol'; start: number; items: string[] } | null = null;
  const flushPara = () => {
    if (!para.length) return;
    const c: Inline[] = [];
    para.forEach((line, k) => {
      if (k > 0) c.push({ t: 'br' });
      c.push(...parseInline(line.trim()));
    });
    blocks.push({ t: 'p', c });
    para = [];
  };
  const flushList = () => {
    if (!list) return;
    const items = list.items.map((it) => parseInline(it.trim()));
    blocks.push(list.t === 'ul' ? { t: 'ul', items } : { t: 'ol', start: list.start, items });
    list = null;
  };
  for (const line of text.split('\n')) {
    if (line.trim() === '') {
      flushPara();
      flushList();
      continue;
    }
    const h = HEADING.exec(line);
    if (h) {
      flushPara();
      flushList();
      blocks.push({ t: 'h', level: Math.min(3, h[1]!.length) as 1 | 2 | 3, c: parseInline(h[2]!.trim()) });
      continue;
    }
    const u = UL.exec(line);
    const o = u ? null : OL.exec(line);
    if (u || o) {
      flushPara();
      const kind = u ? 'ul' : 'ol';
      if (!list || list.t !== kind) {
        flushList();
        list = { t: kind, start: o ? Number(o[1]) : 1, items: [] };
      }
      list.items.push(u ? u[1]! : o![2]!);
      continue;
    }
    if (list && /^\s+\S/.test(line)) {
      // An indented line continues the current list item.
      list.items[list.items.length - 1] += ' ' + line.trim();
      continue;
    }
    flushList();
    para.push(line);
  }
  flushPara();
  flushList();
  return blocks;
}

function inlineHtml(nodes: Inline[]): string {
  return nodes
    .map((n) => {
      switch (n.t) {
        case 'text':
          return escapeHtml(n.v);
        case 'br':
          return '<br>';
        case 'code':
          return `<code>${escapeHtml(n.v)}</code>`;
        case 'strong':
          return `<strong>${inlineHtml(n.c)}</strong>`;
        case 'em':
          return `<em>${inlineHtml(n.c)}</em>`;
        case 'link':
          return `<a href="${escapeHtml(n.href)}" rel="noopener noreferrer nofollow" target="_blank">${inlineHtml(n.c)}</a>`;
      }
    })
    .join('');
}

/** Markdown → an HTML string in which every user character is escaped. */
export function renderMarkdown(src: string): string {
  return parseMarkdown(src)
    .map((b) => {
      if (b.t === 'p') return `<p>${inlineHtml(b.c)}</p>`;
      // Captions sit inside a page that has its own h1/h2: heading levels start at h3.
      if (b.t === 'h') return `<h${b.level + 2} class="md-h">${inlineHtml(b.c)}</h${b.level + 2}>`;
      const items = b.items.map((it) => `<li>${inlineHtml(it)}</li>`).join('');
      if (b.t === 'ul') return `<ul>${items}</ul>`;
      return b.start === 1 ? `<ol>${items}</ol>` : `<ol start="${b.start}">${items}</ol>`;
    })
    .join('\n');
}

/** Plain text of a caption (for titles, aria labels, previews). */
export function markdownToText(src: string): string {
  const flat = (nodes: Inline[]): string =>
    nodes.map((n) => (n.t === 'text' || n.t === 'code' ? n.v : n.t === 'br' ? ' ' : 'c' in n ? flat(n.c) : '')).join('');
  return parseMarkdown(src)
    .map((b) => (b.t === 'p' || b.t === 'h' ? flat(b.c) : b.items.map(flat).join('; ')))
    .join(' ')
    .trim();
}
