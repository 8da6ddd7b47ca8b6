/**
 * The one place a picture is made: a vega-lite spec (data plus a declarative chart) compiled
 * to vega and rendered to SVG text by vega's headless view — no browser, no canvas. Every
 * command's --plot and every HTML report go through here. vega and vega-lite load on the
 * first call, so importing fray does not load them. Every mark that has a `description`
 * gets it as an SVG <title>, so hovering shows its exact figures in any browser without
 * scripts; ids are made unique per picture so several pictures can share one page.
 */
import type { TopLevelSpec } from 'vega-lite';
import { FONT, INK, RULE } from './palette.js';

/** A vega logger that says nothing: the specs are ours, and a CLI's stderr is the user's. */
const SILENT = {
  level(): number {
    return 0;
  },
  error(): void {},
  warn(): void {},
  info(): void {},
  debug(): void {},
};

/** The look every picture starts from (a spec's own `config` wins key by key). */
const CONFIG = {
  font: FONT,
  background: '#ffffff',
  view: { stroke: null },
  axis: { labelColor: INK, titleColor: INK, domainColor: RULE, tickColor: RULE, gridColor: '#ece8df', labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'normal' },
  legend: { labelColor: INK, titleColor: INK, labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'normal' },
} as const;

/** Renders a vega-lite spec to a standalone SVG string, with marks' descriptions as hover titles. */
export async function renderSvg(spec: TopLevelSpec): Promise<string> {
  const [vega, vl] = await Promise.all([import('vega'), import('vega-lite')]);
  const withConfig = { ...spec, config: { ...CONFIG, ...(spec.config ?? {}) } } as TopLevelSpec;
  const compiled = vl.compile(withConfig, { logger: SILENT as unknown as NonNullable<Parameters<typeof vl.compile>[1]>['logger'] }).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', logLevel: vega.Error });
  try {
    return uniqueIds(descriptionsAsTitles(await view.toSVG()));
  } finally {
    view.finalize();
  }
}

/**
 * vega writes a mark's `description` as the aria-label of its self-closing <path>; the same
 * text as a <title> child is what browsers show on hover. The label is already escaped for
 * an attribute, which is also valid element text.
 */
export function descriptionsAsTitles(svg: string): string {
  return svg.replace(/<path aria-label="([^"]*)" role="graphics-symbol"([^>]*?)\/>/g, '<path aria-label="$1" role="graphics-symbol"$2><title>$1</title></path>');
}

/**
 * vega numbers the ids of an SVG's gradients and clip paths from 0 in every picture; a page
 * holding several pictures needs them distinct, so each id gets a prefix derived from the
 * picture's own text (FNV-1a), which keeps the output deterministic.
 */
export function uniqueIds(svg: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < svg.length; i++) h = Math.imul(h ^ svg.charCodeAt(i), 0x01000193);
  const prefix = `p${(h >>> 0).toString(36)}_`;
  return svg.replace(/\bid="([^"]+)"/g, `id="${prefix}$1"`).replace(/url\(#([^)]+)\)/g, `url(#${prefix}$1)`);
}
