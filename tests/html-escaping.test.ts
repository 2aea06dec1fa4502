/**
 * Escaping of user strings in the HTML report (src/report/html.ts, src/report/svg.ts).
 * Sources: W3C XML 1.0 (5th ed.) § 2.4 "Character Data and Markup" (`<` and `&` must be escaped,
 * `"`/`'` inside attribute values); HTML Living Standard § 13.1 "Writing HTML documents"
 * (text and attribute value rules); OWASP Cross Site Scripting Prevention Cheat Sheet, rule 1
 * (encode & < > " ' in element content and quoted attributes) — common practice.
 * No numeric reference values here: the checks are structural (which tags exist after rendering).
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { toJsonText } from '../src/io/output.ts';
import { InternalError } from '../src/errors.ts';
import { escapeHtml, htmlPage, type HtmlPageOptions } from '../src/report/html.ts';
import { withNotes } from '../src/report/notes.ts';
import { escapeXml, linePlot, logLogPlot, timeline } from '../src/report/svg.ts';

const SCRIPT = '<script>alert(1)</script>';
const BREAKOUT = '"><img src=x onerror=alert(1)>';
const QUOTES = `Tom's "clock" & <co>`;
const HOSTILE = [SCRIPT, BREAKOUT, QUOTES];
const T0_MS = Date.UTC(2027, 2, 1);

/** The tags we emit; anything else in the output means user text escaped into markup. */
const ALLOWED_TAGS = new Set([
  'html', 'head', 'meta', 'title', 'style', 'body', 'main', 'header', 'section', 'h1', 'h2', 'p', 'dl', 'dt', 'dd', 'div', 'strong',
  'figure', 'figcaption', 'table', 'caption', 'thead', 'tbody', 'tr', 'th', 'td', 'footer', 'ul', 'li', 'br', 'span',
  'svg', 'g', 'defs', 'clippath', 'rect', 'line', 'path', 'circle', 'text', 'tspan',
]);

/** Tag names and attribute names of every tag, with quoted attribute values blanked out. */
function tagsOf(markup: string): { name: string; attrs: string[] }[] {
  const body = markup.replace(/<style>[\s\S]*?<\/style>/, '<style></style>').replace(/^<!DOCTYPE html>/, '');
  return (body.match(/<[^>]*>/g) ?? []).map((tag) => {
    const bare = tag.replace(/"[^"]*"/g, '""');
    const name = /^<\/?\s*([A-Za-z][\w:-]*)/.exec(bare)?.[1]?.toLowerCase() ?? `?${tag}`;
    const attrs = [...bare.matchAll(/\s([^\s="'<>\/]+)\s*=/g)].map((m) => m[1].toLowerCase());
    return { name, attrs };
  });
}

function expectNoInjectedMarkup(markup: string): void {
  expect(markup).not.toMatch(/<script/i);
  expect(markup).not.toMatch(/<img/i);
  for (const t of tagsOf(markup)) {
    expect(ALLOWED_TAGS, `unexpected tag <${t.name}>`).toContain(t.name);
    for (const a of t.attrs) expect(a, `event handler attribute on <${t.name}>`).not.toMatch(/^on/);
  }
}

function decode(s: string): string {
  return s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');
}

function hostilePlots(name: string): string[] {
  const x = [T0_MS, T0_MS + 3_600_000, T0_MS + 7_200_000];
  return [
    linePlot({
      title: name,
      xKind: 'time',
      yAxis: { label: name, unit: name },
      series: [{ label: name, x, y: [1, 2, 3] }],
      shaded: [{ from: x[0], to: x[1], label: name }],
      hLines: [{ y: 2.5, label: name }],
      points: [{ x: x[1], y: 2, label: name }],
    }),
    logLogPlot({ title: name, xAxis: { label: name, unit: 's' }, yAxis: { label: 'ADEV', unit: '' }, series: [{ label: name, x: [1, 10], y: [1e-12, 3e-13] }] }),
    timeline({ title: name, rows: [name], bars: [{ row: name, fromMs: x[0], toMs: x[2], label: name, group: name }] }),
  ];
}

function hostilePage(name: string): HtmlPageOptions {
  return {
    title: name,
    subtitle: name,
    caution: name,
    meta: [{ label: name, value: name }],
    sections: [
      {
        heading: name,
        intro: `${name}\n\n${name}`,
        figures: hostilePlots(name).map((svg) => ({ svg, caption: name })),
        tables: [{ caption: name, columns: [name, { label: name, unit: name }], rows: [[name, 1.5], [name, null]] }],
      },
    ],
    footer: name,
  };
}

describe('escapeHtml / escapeXml', () => {
  it('map the five markup characters to entities', () => {
    for (const esc of [escapeHtml, escapeXml]) {
      expect(esc(`&<>"'`)).toBe('&amp;&lt;&gt;&quot;&#39;');
      expect(esc('a&amp;b')).toBe('a&amp;amp;b'); // already-escaped text is escaped again, not passed through
    }
  });

  it('leave no markup characters and decode back to the input (any string)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        for (const esc of [escapeHtml, escapeXml]) {
          const e = esc(s);
          expect(e).not.toMatch(/[<>"']/);
          expect(decode(e)).toBe(s);
        }
      }),
    );
  });
});

describe('hostile names in the report', () => {
  for (const name of HOSTILE) {
    it(`escapes ${JSON.stringify(name)} in title, legend, limit and point labels, timeline rows, tables`, () => {
      const html = htmlPage(hostilePage(name));
      expectNoInjectedMarkup(html);
      // The text is still there, escaped (so the report says what the user wrote).
      expect(html).toContain(escapeHtml(name));
      expect(html).toContain(`<title>${escapeHtml(name)}</title>`);
      expect(html).toContain(`<td>${escapeHtml(name)}</td>`);
      for (const svg of hostilePlots(name)) {
        expectNoInjectedMarkup(svg);
        expect(svg).toContain(`<title>${escapeXml(name)}</title>`);
      }
    });
  }

  for (const name of HOSTILE) {
    it(`escapes ${JSON.stringify(name)} in the whole-job report's notes box, group rows, units and split tables`, () => {
      const page = htmlPage({
        title: 't',
        caution: 'c',
        notes: [name],
        sections: [
          {
            heading: name,
            tables: [
              {
                caption: name,
                maxColumns: 3,
                columns: [{ label: name, key: true }, { label: 'a', unit: name, part: 1 }, { label: 'b', unit: 'ns', part: 2 }, { label: 'c', part: 2 }],
                rows: [{ group: name }, [name, 1.5, -2, name]],
              },
            ],
          },
        ],
      });
      // A note added after rendering (as emit and report do) goes into the same box, escaped.
      const html = withNotes('html', page, [name, `${name} (late)`]);
      expectNoInjectedMarkup(html);
      expect(html).toContain(`<li>${escapeHtml(name)}</li>`);
      expect(html).toContain(`<li>${escapeHtml(name)} (late)</li>`);
      expect(html.match(/<div class="notes"/g)?.length).toBe(1);
      expect(html).toContain(`colspan="2">${escapeHtml(name)}</th>`);
      expect(html.match(/part \d of 2/g)?.length).toBe(2);
      expect(html).toContain('<td class="num">\u22122</td>'); // one minus sign in HTML: U+2212
    });
  }

  it('the injection check itself notices raw markup', () => {
    expect(() => expectNoInjectedMarkup(`<p>${BREAKOUT}</p>`)).toThrow();
    expect(() => expectNoInjectedMarkup(`<p title="x" onclick="y">z</p>`)).toThrow();
  });

  it('keeps the CSP meta tag that forbids scripts and external loads', () => {
    const html = htmlPage(hostilePage('x'));
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html)?.[1];
    expect(csp).toBeDefined();
    const policy = decode(csp!);
    expect(policy).toContain("default-src 'none'");
    expect(policy).toContain("style-src 'unsafe-inline'");
    expect(policy).toContain('img-src data:');
    expect(policy).not.toMatch(/script-src/);
  });

  it('refuses a figure that is not plain SVG', () => {
    const page = (svg: string) => htmlPage({ title: 't', caution: 'c', sections: [{ heading: 'h', figures: [svg] }] });
    expect(() => page('<svg><script>alert(1)</script></svg>')).toThrow(InternalError);
    expect(() => page('<svg><rect onload="alert(1)"/></svg>')).toThrow(InternalError);
    expect(() => page('<div>not svg</div>')).toThrow(InternalError);
    // Escaped hostile text inside our own figures is fine.
    expect(() => page(hostilePlots(BREAKOUT)[0])).not.toThrow();
  });

  it('right-aligns numeric table cells only', () => {
    const html = htmlPage({ title: 't', caution: 'c', sections: [{ heading: 'h', tables: [{ caption: 'c', columns: ['Name', 'Value'], rows: [['a', -1.25], ['b', 2]] }] }] });
    expect(html).toContain('<td>a</td><td class="num">\u22121.25</td>');
    expect(html).toContain('<th scope="col" class="num">Value</th>');
    expect(html).toContain('<th scope="col">Name</th>');
  });
});

describe('non-finite numbers never reach the output', () => {
  const base = { title: 't', yAxis: { label: 'y', unit: 'ns' } };
  it.each([
    ['NaN y', () => linePlot({ ...base, series: [{ label: 's', x: [0, 1], y: [0, NaN] }] })],
    ['Infinity x', () => linePlot({ ...base, series: [{ label: 's', x: [0, Infinity], y: [0, 1] }] })],
    ['NaN limit line', () => linePlot({ ...base, series: [{ label: 's', x: [0, 1], y: [0, 1] }], hLines: [{ y: NaN, label: 'L' }] })],
    ['NaN marked point', () => linePlot({ ...base, series: [], points: [{ x: 1, y: NaN, label: 'p' }] })],
    ['NaN shaded interval', () => linePlot({ ...base, series: [], shaded: [{ from: NaN, to: 1 }] })],
    ['NaN on a log axis', () => logLogPlot({ title: 't', xAxis: { label: 'tau', unit: 's' }, yAxis: { label: 'd', unit: '' }, series: [{ label: 's', x: [1, 2], y: [1e-12, NaN] }] })],
    ['zero on a log axis', () => logLogPlot({ title: 't', xAxis: { label: 'tau', unit: 's' }, yAxis: { label: 'd', unit: '' }, series: [{ label: 's', x: [0, 2], y: [1e-12, 1e-13] }] })],
    ['NaN bar time', () => timeline({ title: 't', bars: [{ row: 'r', fromMs: NaN, toMs: 1 }] })],
    ['NaN table cell', () => htmlPage({ title: 't', caution: 'c', sections: [{ heading: 'h', tables: [{ caption: 'c', columns: ['v'], rows: [[NaN]] }] }] })],
  ])('%s throws InternalError', (_what, make) => {
    expect(make).toThrow(InternalError);
  });
  it('JSON output names where the non-finite number is, and passes finite values through', () => {
    expect(() => toJsonText({ a: [1, { b: Infinity }] })).toThrow('non-finite number Infinity at $.a[1].b in the output');
    expect(() => toJsonText([{ ok: 1 }, NaN])).toThrow('non-finite number NaN at $[1] in the output');
    expect(toJsonText({ a: [1, { b: -0.5 }], s: 'x', n: null })).toBe(`${JSON.stringify({ a: [1, { b: -0.5 }], s: 'x', n: null }, null, 2)}\n`);
  });
});
