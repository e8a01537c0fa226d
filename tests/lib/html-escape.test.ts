/**
 * Hostile text (markup, quotes, ampersands) typed into names, notes, remarks and mail reaches
 * the report, the report's SVG plots and the mail only as text: one escaper (escape-html) for all.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { buildExport } from '@/lib/handoff/exports';
import { plotSvg } from '@/lib/handoff/svg-plot';
import { renderMail } from '@/lib/mail-render';

const HOSTILE = `<script>alert("x")</script> & 'co' <img src=x onerror=alert(1)>`;
const ESCAPED = '&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &#39;co&#39; &lt;img src=x onerror=alert(1)&gt;';

/** No tag, attribute or entity of the hostile text survives as markup. */
function expectInert(out: string) {
  expect(out).not.toContain('<script');
  expect(out).not.toContain('<img');
  expect(out).not.toMatch(/onerror=alert\(1\)>/);
  expect(out).toContain(ESCAPED);
}

describe('one HTML escaper for report, SVG and mail', () => {
  it('the report shows hostile design, revision, trail and remark text as text', () => {
    const sample = SAMPLE_DESIGNS[0];
    const html = buildExport('report', {
      design: { name: HOSTILE, description: HOSTILE, topology: 'buck', designatorMap: {} },
      revision: { number: 1, note: HOSTILE, createdAt: new Date('2026-02-03T10:20:00Z'), authorName: HOSTILE, input: sample.request },
      signoff: { state: 'in-review', at: null, by: null },
      result: analyze(sample.request),
      teamName: HOSTILE,
      now: new Date('2026-02-05T08:00:00Z'),
      trail: [{ state: 'in-review', actorName: HOSTILE, reviewerName: HOSTILE, message: HOSTILE, at: new Date('2026-02-04T09:00:00Z') }],
      remarks: [{ authorName: HOSTILE, body: HOSTILE, at: new Date('2026-02-04T09:30:00Z'), comparedWith: null }],
    }).body;
    expectInert(html);
    // name, description, note, author, team, trail (actor, reviewer, message), remark (author, body), <title>
    expect(html.split(ESCAPED).length - 1).toBeGreaterThanOrEqual(10);
  });

  it('the SVG plot escapes its title, panel titles, series labels and markers (text and attributes)', () => {
    const svg = plotSvg({
      id: `x" onload="alert(1)`,
      title: HOSTILE,
      panels: [
        {
          title: HOSTILE,
          step: 10,
          series: [
            { label: HOSTILE, color: '#000', f: [10, 100, 1000], y: [1, 0, -1] },
            { label: HOSTILE, color: '#000', f: [10, 100, 1000], y: [1, 0, -1], dots: true },
          ],
        },
      ],
      markers: [{ f: 100, label: HOSTILE, color: '#000' }],
    });
    expectInert(svg);
    expect(svg).toContain(`aria-label="${ESCAPED}"`);
    expect(svg).toContain(`data-series="${ESCAPED}"`);
    expect(svg).not.toContain('" onload="');
  });

  it('the mail escapes paragraphs, the quoted remark and the link', () => {
    const { html, text } = renderMail({
      to: 'x@example.test',
      subject: 's',
      paragraphs: [HOSTILE],
      quote: HOSTILE,
      link: { label: HOSTILE, url: `https://example.test/?a=1&b="2"` },
    });
    expectInert(html);
    expect(html).toContain('href="https://example.test/?a=1&amp;b=&quot;2&quot;"');
    expect(text).toContain(HOSTILE); // the plain-text part stays as typed
  });
});
