import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { comparisonBarsSpec, valueDomain } from '../../src/plots/comparisonBars.js';
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

  it('widens the value axis to a bar outside the declared range (an extrapolated ⟨P⟩ of 1.3), never narrows it', () => {
    const chart = (values: number[]) => ({
      bars: values.map((value, i) => ({ category: 'ZZ', series: (['ideal', 'noisy', 'mitigated'] as const)[i]!, value, title: '' })),
      categories: ['ZZ'],
      categoryTitle: 'Pauli string',
      valueTitle: '⟨P⟩',
      domain: [-1, 1] as const,
    });
    expect(valueDomain(chart([1, 0.8, 1.3]))).toEqual([-1, 1.3]);
    expect(valueDomain(chart([-1, -0.8, -1.05]))).toEqual([-1.05, 1]);
    expect(valueDomain(chart([1, 0.8, 0.95]))).toEqual([-1, 1]);
    expect(valueDomain(chart([1, 0.8, Number.NaN]))).toEqual([-1, 1]);
    const spec = comparisonBarsSpec(chart([1, 0.8, 1.3])) as { encoding: { y: { scale: { domain: number[] } } } };
    expect(spec.encoding.y.scale.domain).toEqual([-1, 1.3]);
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
