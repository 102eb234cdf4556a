import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseMarkdown, renderMarkdown, safeHref, markdownToText } from '../../../src/lib/markdown';

/** Every tag the renderer may emit; anything else in the output would be injected markup. */
const ALLOWED_TAG = /<\/?(p|ul|ol|li|strong|em|code|br|h3|h4|h5)>|<h[345] class="md-h">|<ol start="\d+">|<a href="[^"<>]*" rel="noopener noreferrer nofollow" target="_blank">|<\/a>/g;

function assertOnlyOwnMarkup(html: string) {
  const rest = html.replace(ALLOWED_TAG, '');
  expect(rest).not.toMatch(/[<>]/);
  for (const m of html.matchAll(/href="([^"]*)"/g)) expect(m[1]).toMatch(/^https?:\/\//);
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
    const alphabet = fc.constantFrom(...'<>"\'&*_`[]()!:/\\-+. \nabcjavscript1x=onerrhtp'.split(''));
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 80 }).map((a) => a.join('')), (s) => {
        assertOnlyOwnMarkup(renderMarkdown(s));
      }),
      { numRuns: 500 },
    );
  });
});

describe('renderMarkdown: the supported subset', () => {
  it('renders paragraphs split by blank lines and keeps single line breaks', () => {
    expect(renderMarkdown('first line\nsecond\n\nnext')).toBe('<p>first line<br>second</p>\n<p>next</p>');
  });
  it('renders bold, italic and code', () => {
    expect(renderMarkdown('**Sun** is *bright*, see `alt > 0`')).toBe(
      '<p><strong>Sun</strong> is <em>bright</em>, see <code>alt &gt; 0</code></p>',
    );
  });
  it('nests italic inside bold', () => {
    expect(renderMarkdown('**the *celestial* equator**')).toBe('<p><strong>the <em>celestial</em> equator</strong></p>');
  });
  it('leaves snake_case words alone', () => {
    expect(renderMarkdown('min_altitude and max_altitude')).toBe('<p>min_altitude and max_altitude</p>');
  });
  it('renders bullet and numbered lists', () => {
    expect(renderMarkdown('- one\n- two')).toBe('<ul><li>one</li><li>two</li></ul>');
    expect(renderMarkdown('3. three\n4. four')).toBe('<ol start="3"><li>three</li><li>four</li></ol>');
  });
  it('renders http(s) links with safe rel', () => {
    expect(renderMarkdown('[site](https://larkspur.example/a?b=1&c=2)')).toBe(
      '<p><a href="https://larkspur.example/a?b=1&amp;c=2" rel="noopener noreferrer nofollow" target="_blank">site</a></p>',
    );
  });
  it('honours backslash escapes', () => {
    expect(renderMarkdown('\\*not italic\\*')).toBe('<p>*not italic*</p>');
  });
  it('leaves unmatched delimiters as text', () => {
    expect(renderMarkdown('2 * 3 and **open')).toBe('<p>2 * 3 and **open</p>');
  });
  it('parses to a tree', () => {
    expect(parseMarkdown('*a*')).toEqual([{ t: 'p', c: [{ t: 'em', c: [{ t: 'text', v: 'a' }] }] }]);
  });
  it('gives plain text for previews', () => {
    expect(markdownToText('**Look** at [Vega](https://x.example/)\n- a\n- b')).toBe('Look at Vega a; b');
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
  });
  it('a heading ends the paragraph before it', () => {
    expect(renderMarkdown('text\n### Next')).toBe('<p>text</p>\n<h5 class="md-h">Next</h5>');
  });
});
