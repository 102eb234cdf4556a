import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseFragment } from 'parse5';
import { markdownToText, renderMarkdown, safeHref, sanitizeHtml } from '../../../src/lib/markdown';
import { DOMPURIFY_VECTORS, JS_XSS_OWASP_VECTORS } from './xss-vectors';

/** Every tag the renderer may emit; anything else in the output would be injected markup. */
const ALLOWED_TAG = /<\/?(p|ul|ol|li|strong|em|code|br|h3|h4|h5)>|<h[345] class="md-h">|<ol start="\d+">|<a href="[^"<>]*" rel="noopener noreferrer nofollow" target="_blank">|<\/a>/g;

function assertOnlyOwnMarkup(html: string) {
  const rest = html.replace(ALLOWED_TAG, '');
  expect(rest).not.toMatch(/[<>]/);
  for (const m of html.matchAll(/href="([^"]*)"/g)) expect(m[1]).toMatch(/^https?:\/\//);
}

/** The allow-list, as a browser would read the HTML: parse5 implements the WHATWG HTML parsing algorithm. */
const ALLOWED_ATTRS: Record<string, string[]> = { p: [], br: [], strong: [], em: [], code: [], ul: [], ol: ['start'], li: [], h3: ['class'], h4: ['class'], h5: ['class'], a: ['href', 'rel', 'target'] };
type Node = { nodeName: string; tagName?: string; attrs?: { name: string; value: string }[]; childNodes?: Node[]; content?: Node };

/** No element, attribute or link target off the list survives: so no script, no event handler, no javascript: URL. */
function assertSafeAsParsed(html: string) {
  const walk = (n: Node) => {
    for (const c of [...(n.childNodes ?? []), ...(n.content ? [n.content] : [])]) {
      if (c.tagName !== undefined) {
        expect(Object.keys(ALLOWED_ATTRS), `element <${c.tagName}> in ${html}`).toContain(c.tagName);
        for (const a of c.attrs ?? []) {
          expect(ALLOWED_ATTRS[c.tagName], `attribute ${a.name} on <${c.tagName}> in ${html}`).toContain(a.name);
          if (a.name === 'href') expect(a.value).toMatch(/^https?:\/\/[^\s]/);
        }
      }
      walk(c);
    }
  };
  walk(parseFragment(html) as unknown as Node);
}

// Payloads: common practice (the classic XSS filter-evasion cases, e.g. the OWASP XSS filter evasion cheat sheet).
const PAYLOADS = [
  '<img src=x onerror=alert(1)>',
  '<script>alert(1)</script>',
  '<svg/onload=alert(1)>',
  '"><img src=x onerror=alert(1)>',
  '[click](javascript:alert(1))',
  '[click](JaVaScRiPt:alert(1))',
  '[click]( javascript:alert(1))',
  '[click](java\tscript:alert(1))',
  '[click](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '[click](vbscript:msgbox(1))',
  '[x](https://ok.example/" onmouseover="alert(1))',
  '[<img src=x onerror=alert(1)>](https://ok.example/)',
  '**<b onclick=alert(1)>bold</b>**',
  '`<script>alert(1)</script>`',
  '<a href="javascript:alert(1)">x</a>',
  '&lt;script&gt;',
  '<iframe src="https://evil.example"></iframe>',
  '- <img src=x onerror=alert(1)>\n- second',
];

describe('renderMarkdown: no raw HTML ever', () => {
  it.each(PAYLOADS)('neutralises %s', (payload) => {
    const html = renderMarkdown(payload);
    assertOnlyOwnMarkup(html);
    assertSafeAsParsed(html);
    expect(html).not.toMatch(/<img|<script|<svg|<iframe|href="(?!https?:)/i);
  });

  it('escapes the img payload to visible text', () => {
    expect(renderMarkdown('<img src=x onerror=alert(1)>')).toBe('<p>&lt;img src=x onerror=alert(1)&gt;</p>');
  });

  it('keeps the label of a javascript: link as plain text', () => {
    expect(renderMarkdown('[click](javascript:alert(1))')).toBe('<p>click</p>');
  });

  it('escapes quotes so an attribute cannot be closed', () => {
    expect(renderMarkdown('"quoted" & \'single\'')).toBe('<p>&quot;quoted&quot; &amp; &#39;single&#39;</p>');
  });

  it('only ever emits its own tags, for any input (property test)', () => {
    const alphabet = fc.constantFrom(...'<>"\'&*_`[]()!:/\\-+#. \nabcjavscript1x=onerrhtp'.split(''));
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 80 }).map((a) => a.join('')), (s) => {
        const html = renderMarkdown(s);
        assertOnlyOwnMarkup(html);
        assertSafeAsParsed(html);
      }),
      { numRuns: 500 },
    );
  });

  it('the checks above catch injected markup (they can fail)', () => {
    expect(() => assertSafeAsParsed('<img src=x onerror=alert(1)>')).toThrow();
    expect(() => assertSafeAsParsed('<a href="javascript:alert(1)">x</a>')).toThrow();
    expect(() => assertSafeAsParsed('<p onclick="alert(1)">x</p>')).toThrow();
    expect(() => assertOnlyOwnMarkup('<p><b>x</b></p>')).toThrow();
  });
});

describe.each([
  ['js-xss test/test_xss.js (OWASP cheat sheet)', JS_XSS_OWASP_VECTORS],
  ['DOMPurify test/fixtures/expect.mjs', DOMPURIFY_VECTORS],
])('the sanitiser’s own payload lists: %s', (_source, vectors) => {
  it.each(vectors)('as Markdown, as a link target and as a link label: %s', (v) => {
    for (const src of [v, `[x](${v})`, `[${v}](https://ok.example/)`, `- ${v}\n\n# ${v}`]) {
      const html = renderMarkdown(src);
      assertOnlyOwnMarkup(html);
      assertSafeAsParsed(html);
    }
  });
  it.each(vectors)('as HTML straight into the sanitiser: %s', (v) => {
    assertSafeAsParsed(sanitizeHtml(v));
  });
});

describe('sanitizeHtml: the allow-list', () => {
  it('keeps the subset’s own markup unchanged', () => {
    const own = '<h3 class="md-h">T</h3>\n<p><strong>a</strong> <em>b</em> <code>c</code><br>\n<a href="https://x.example/?a=1&amp;b=2" rel="noopener noreferrer nofollow" target="_blank">d</a></p>\n<ol start="3">\n<li>e</li>\n</ol>';
    expect(sanitizeHtml(own)).toBe(own);
  });
  it('drops attributes off the list, or with values off the list, whole', () => {
    expect(sanitizeHtml('<a href="javascript:alert(1)" onclick="x" target="_top" rel="opener">y</a>')).toBe('<a>y</a>');
    expect(sanitizeHtml('<ol start="3x"><li>i</li></ol><h3 class="big" id="h">h</h3>')).toBe('<ol><li>i</li></ol><h3>h</h3>');
  });
  it('drops tags off the list, and the bodies of script and style', () => {
    expect(sanitizeHtml('a<img src=x onerror=alert(1)>b<script>alert(1)</script>c<style>*{}</style>d<b>e</b>')).toBe('abcde');
  });
});

describe('renderMarkdown: the supported subset', () => {
  it('renders paragraphs split by blank lines and keeps single line breaks', () => {
    expect(renderMarkdown('first line\nsecond\n\nnext')).toBe('<p>first line<br>\nsecond</p>\n<p>next</p>');
  });
  it('renders bold, italic and code', () => {
    expect(renderMarkdown('**Sun** is *bright*, see `alt > 0`')).toBe('<p><strong>Sun</strong> is <em>bright</em>, see <code>alt &gt; 0</code></p>');
  });
  it('nests italic inside bold', () => {
    expect(renderMarkdown('**the *celestial* equator**')).toBe('<p><strong>the <em>celestial</em> equator</strong></p>');
  });
  it('leaves snake_case words alone', () => {
    expect(renderMarkdown('min_altitude and max_altitude')).toBe('<p>min_altitude and max_altitude</p>');
  });
  it('renders bullet and numbered lists', () => {
    expect(renderMarkdown('- one\n- two')).toBe('<ul>\n<li>one</li>\n<li>two</li>\n</ul>');
    expect(renderMarkdown('3. three\n4. four')).toBe('<ol start="3">\n<li>three</li>\n<li>four</li>\n</ol>');
  });
  it('renders http(s) links with safe rel', () => {
    expect(renderMarkdown('[site](https://larkspur.example/a?b=1&c=2)')).toBe(
      '<p><a href="https://larkspur.example/a?b=1&amp;c=2" rel="noopener noreferrer nofollow" target="_blank">site</a></p>',
    );
  });
  it('drops a link title (not in the subset)', () => {
    expect(renderMarkdown('[t](https://x.example "title")')).toBe('<p><a href="https://x.example/" rel="noopener noreferrer nofollow" target="_blank">t</a></p>');
  });
  it('honours backslash escapes', () => {
    expect(renderMarkdown('\\*not italic\\*')).toBe('<p>*not italic*</p>');
  });
  it('leaves unmatched delimiters as text', () => {
    expect(renderMarkdown('2 * 3 and **open')).toBe('<p>2 * 3 and **open</p>');
  });
  // CommonMark 0.31 names each of these constructs; the subset leaves them as the characters typed.
  it.each([
    ['![alt](https://x.example/a.png)', '<p>!<a href="https://x.example/a.png" rel="noopener noreferrer nofollow" target="_blank">alt</a></p>'],
    ['> quoted', '<p>&gt; quoted</p>'],
    ['    indented', '<p>indented</p>'],
    ['---', '<p>---</p>'],
    ['<https://x.example>', '<p>&lt;https://x.example&gt;</p>'],
    ['&lt;b&gt;', '<p>&amp;lt;b&amp;gt;</p>'],
    ['[a]: https://x.example\n\n[a]', '<p>[a]: https://x.example</p>\n<p>[a]</p>'],
    ['Title\n===', '<p>Title<br>\n===</p>'],
  ])('outside the subset, %j stays as typed', (src, html) => {
    expect(renderMarkdown(src)).toBe(html);
  });
  it('gives plain text for previews', () => {
    expect(markdownToText('**Look** at [Vega](https://x.example/)\n- a\n- b')).toBe('Look at Vega a; b');
  });
});

describe('pathological input (cmark test/pathological_tests.py): the whole text comes back; timings in tests/bench/markdown.bench.ts', () => {
  it('`[` 10,000 times', () => {
    expect(renderMarkdown('['.repeat(10_000))).toBe(`<p>${'['.repeat(10_000)}</p>`);
  });
  it('a backtick run of 10,000 with no closer', () => {
    expect(renderMarkdown('`'.repeat(10_000) + 'a')).toBe(`<p>${'`'.repeat(10_000)}a</p>`);
  });
  it('emphasis nested 1,000 deep', () => {
    const html = renderMarkdown('*a **a '.repeat(1000) + 'b' + ' a** a*'.repeat(1000));
    expect(html.startsWith('<p><em>a <strong>a <em>a')).toBe(true);
    expect(html.match(/<strong>/g)).toHaveLength(1000);
    expect(html.match(/<em>/g)).toHaveLength(1000);
    assertSafeAsParsed(html);
  });
  it('input past 20,000 characters is cut', () => {
    expect(renderMarkdown('x'.repeat(25_000))).toBe(`<p>${'x'.repeat(20_000)}</p>`);
  });
});

describe('safeHref', () => {
  it('accepts http and https only', () => {
    expect(safeHref('https://example.org/x')).toBe('https://example.org/x');
    expect(safeHref('http://example.org')).toBe('http://example.org/');
    for (const bad of ['javascript:alert(1)', 'mailto:a@b.example', '/relative', '//evil.example', 'ftp://x.example', 'https://', 'https://a b.example', 'data:,x'])
      expect(safeHref(bad)).toBeNull();
  });
});

describe('headings', () => {
  // CommonMark 0.31 §4.2 (ATX headings): `#`–`######` then a space; closing #s are dropped.
  it('renders ATX headings below the page headings, escaped', () => {
    expect(renderMarkdown('## Where we stand ##')).toBe('<h4 class="md-h">Where we stand</h4>');
    expect(renderMarkdown('# A <b>')).toBe('<h3 class="md-h">A &lt;b&gt;</h3>');
    expect(renderMarkdown('#no-space')).toBe('<p>#no-space</p>');
    expect(renderMarkdown('###### six')).toBe('<h5 class="md-h">six</h5>');
  });
  it('a heading ends the paragraph before it', () => {
    expect(renderMarkdown('text\n### Next')).toBe('<p>text</p>\n<h5 class="md-h">Next</h5>');
  });
});
