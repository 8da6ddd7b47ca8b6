import type { TopLevelSpec } from 'vega-lite';

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

/**
 * The one place a picture is made: a vega-lite spec (data plus a declarative chart) compiled
 * to vega and rendered to SVG text by vega's headless view — no browser, no canvas. Every
 * command's --plot, and report pages built later, go through here. vega and vega-lite load
 * on the first call, so importing fray does not load them.
 */
export async function renderSvg(spec: TopLevelSpec): Promise<string> {
  const [vega, vl] = await Promise.all([import('vega'), import('vega-lite')]);
  const compiled = vl.compile(spec, { logger: SILENT as unknown as NonNullable<Parameters<typeof vl.compile>[1]>['logger'] }).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', logLevel: vega.Error });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}
