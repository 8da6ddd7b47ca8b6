import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { comparisonBarsSpec } from '../../src/plots/comparisonBars.js';
import { descriptionsAsTitles, renderSvg, uniqueIds } from '../../src/plots/render.js';

describe('renderSvg: vega-lite to SVG', () => {
  it('draws one bar per value, each with its description as a hover title', async () => {
    const svg = await renderSvg(
      comparisonBarsSpec({
        bars: [
          { category: '00', series: 'ideal', value: 0.5, title: '00 ideal <0.5>' },
          { category: '00', series: 'noisy', value: 0.4, title: '00 noisy' },
          { category: '11', series: 'ideal', value: 0.5, title: '11 ideal' },
          { category: '11', series: 'noisy', value: 0.45, title: '11 noisy' },
        ],
        categories: ['00', '11'],
        categoryTitle: 'outcome',
        valueTitle: 'probability',
        domain: [0, 1],
      }),
    );
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg.match(/<title>/g)?.length).toBe(4);
    expect(svg).toContain('<title>00 ideal &lt;0.5&gt;</title>');
  });

  it('turns aria-labels of self-closing paths into titles and leaves other elements alone', () => {
    expect(descriptionsAsTitles('<g aria-label="axis" role="graphics-symbol"><path aria-label="a &amp; b" role="graphics-symbol" d="M0,0h1"/></g>')).toBe(
      '<g aria-label="axis" role="graphics-symbol"><path aria-label="a &amp; b" role="graphics-symbol" d="M0,0h1"><title>a &amp; b</title></path></g>',
    );
  });

  it('gives the ids of different pictures different prefixes, and rewrites their references', () => {
    const a = uniqueIds('<svg><linearGradient id="gradient_0"/><path fill="url(#gradient_0)"/></svg>');
    const b = uniqueIds('<svg><linearGradient id="gradient_0"/><path fill="url(#gradient_0)" d="M1"/></svg>');
    const idA = /id="([^"]+)"/.exec(a)![1]!;
    const idB = /id="([^"]+)"/.exec(b)![1]!;
    expect(idA).not.toBe(idB);
    expect(idA).toMatch(/_gradient_0$/);
    expect(a).toContain(`url(#${idA})`);
    expect(uniqueIds('<svg><linearGradient id="gradient_0"/><path fill="url(#gradient_0)"/></svg>')).toBe(a);
  });
});
