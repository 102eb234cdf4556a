/**
 * Markdown for what reviewers and presenters type (captions, descriptions, comments): markdown-it parses
 * a fixed CommonMark subset, js-xss (`xss`) then holds the HTML to an allow-list. One function serves the
 * browser (components/briefing/Markdown.tsx) and the server-rendered handout. Why these two: README.md.
 *
 * The subset: paragraphs (a single line break stays a line break), **bold**, *italic*, `code`, bullet and
 * numbered lists, ATX headings (rendered h3–h5 below the page's own headings) and [links](https://…) with
 * http(s) targets only; a link to anything else keeps its label as plain text. Raw HTML, images, quotes,
 * code blocks, rules, autolinks and entities stay as the characters typed.
 */
import MarkdownIt from 'markdown-it';
import { FilterXSS } from 'xss';

/** Longer input is cut (a caption is a few lines; this bounds the work on any input). */
const MAX_INPUT = 20_000;

/** Returns a normalised http(s) URL, or null for anything else (javascript:, data:, relative, malformed). */
export function safeHref(raw: string): string | null {
  const s = raw.trim();
  // Control characters and whitespace inside a URL are a classic way to smuggle a scheme past a check.
  if (!s || /[\u0000-\u0020\u007f-\u009f<>"'`\\]/.test(s)) return null;
  if (!/^https?:\/\//i.test(s)) return null;
  try {
    const u = new URL(s);
    if ((u.protocol !== 'http:' && u.protocol !== 'https:') || !u.hostname) return null;
    return u.href;
  } catch {
    return null;
  }
}

const LINK_REL = 'noopener noreferrer nofollow';

const md = new MarkdownIt('commonmark', { html: false, xhtmlOut: false, breaks: true, linkify: false, typographer: false });
// The commonmark preset caps nested blocks (lists in lists) at 20 levels: what is deeper is left out, not recursed into.
// Text is escaped as markdown-it does, and `'` too (as the product always has: no quote of any kind survives).
const escapeText = (s: string) => md.utils.escapeHtml(s).replace(/'/g, '&#39;');
md.renderer.rules.text = (tokens, i) => escapeText(tokens[i]!.content);
md.renderer.rules.code_inline = (tokens, i) => `<code>${escapeText(tokens[i]!.content)}</code>`;
// Constructs outside the subset are switched off, so what they would match stays plain text.
md.disable(['blockquote', 'code', 'fence', 'hr', 'html_block', 'lheading', 'reference', 'autolink', 'entity', 'html_inline', 'image']);
// Every link is parsed; the core rule below decides (so an unsafe target can keep its label as text).
md.validateLink = () => true;
md.core.ruler.push('armilla_subset', (state) => {
  for (const block of state.tokens) {
    if (block.type === 'heading_open' || block.type === 'heading_close') {
      // Captions sit inside a page that has its own h1/h2: `#` is h3, `##` h4, `###` and deeper h5.
      block.tag = `h${Math.min(3, Number(block.tag.slice(1))) + 2}`;
      if (block.type === 'heading_open') block.attrSet('class', 'md-h');
    }
    if (block.type !== 'inline' || !block.children) continue;
    let dropClose = false;
    block.children = block.children.filter((t) => {
      if (t.type === 'link_open') {
        const href = safeHref(t.attrGet('href') ?? '');
        dropClose = !href;
        if (!href) return false;
        t.attrs = [['href', href], ['rel', LINK_REL], ['target', '_blank']];
      } else if (t.type === 'link_close' && dropClose) {
        dropClose = false;
        return false;
      }
      return true;
    });
  }
});

/** The HTML the renderer may emit, and nothing else: tags, their attributes, and the values allowed. */
const ALLOWED: Record<string, string[]> = { p: [], br: [], strong: [], em: [], code: [], ul: [], ol: ['start'], li: [], h3: ['class'], h4: ['class'], h5: ['class'], a: ['href', 'rel', 'target'] };
const ATTR_VALUE: Record<string, (v: string) => string | null> = {
  // markdown-it wrote `&` as `&amp;`; safeHref's answer is percent-encoded but for `&`.
  href: (v) => safeHref(v.replace(/&amp;/g, '&'))?.replace(/&/g, '&amp;') ?? null,
  start: (v) => (/^\d{1,9}$/.test(v) ? v : null),
  class: (v) => (v === 'md-h' ? v : null),
  rel: (v) => (v === LINK_REL ? v : null),
  target: (v) => (v === '_blank' ? v : null),
};
const sanitizer = new FilterXSS({
  whiteList: ALLOWED,
  stripIgnoreTag: true,
  stripIgnoreTagBody: ['script', 'style', 'iframe', 'object', 'embed', 'noscript', 'template', 'textarea', 'title', 'xmp'],
  allowCommentTag: false,
  css: false,
  // An attribute off the list, or with a value off the list, is dropped whole (not left bare).
  onTagAttr(_tag, name, value, isWhiteAttr) {
    const v = isWhiteAttr ? ATTR_VALUE[name]?.(value) : null;
    return v ? `${name}="${v}"` : '';
  },
});

/** Any HTML held to the allow-list above (exported for the tests that feed it hostile HTML directly). */
export function sanitizeHtml(html: string): string {
  return sanitizer.process(html);
}

/** Markdown → HTML in which every user character is escaped and only the subset's tags appear. */
export function renderMarkdown(src: string): string {
  return sanitizeHtml(md.render(String(src ?? '').slice(0, MAX_INPUT))).trim();
}

/** Plain text of a caption (for titles, aria labels, previews): blocks joined by spaces, list items by "; ". */
export function markdownToText(src: string): string {
  const blocks: string[] = [];
  let items: string[] = [];
  let item: string[] = [];
  let depth = 0;
  for (const t of md.parse(String(src ?? '').slice(0, MAX_INPUT), {})) {
    if (t.type === 'bullet_list_open' || t.type === 'ordered_list_open') depth++;
    else if (t.type === 'list_item_close' && depth === 1) {
      items.push(item.join(' '));
      item = [];
    } else if ((t.type === 'bullet_list_close' || t.type === 'ordered_list_close') && --depth === 0) {
      blocks.push(items.join('; '));
      items = [];
    } else if (t.type === 'inline') {
      const text = (t.children ?? []).map((c) => (c.type === 'text' || c.type === 'code_inline' ? c.content : c.type === 'softbreak' || c.type === 'hardbreak' ? ' ' : '')).join('');
      (depth ? item : blocks).push(text);
    }
  }
  return blocks.join(' ').trim();
}
