import * as vega from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';

/** A vega logger that says nothing (level, warn, info, debug, error). */
const SILENT = {
  level(): number {
    return 0;
  },
  error(): void {},
  warn(): void {},
  info(): void {},
  debug(): void {},
} as unknown as Parameters<typeof compile>[1] extends infer O ? (O extends { logger?: infer L } ? L : never) : never;

/**
 * The one place a picture is made: a vega-lite spec (data plus a declarative chart) compiled
 * to vega and rendered to SVG text by vega's headless view — no browser, no canvas. Every
 * command's --plot, and report pages built later, go through here.
 */
export async function renderSvg(spec: TopLevelSpec): Promise<string> {
  // vega-lite's notes about the spec go nowhere: the specs are ours, and a CLI's stderr is the user's.
  const compiled = compile(spec, { logger: SILENT }).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', logLevel: vega.Error });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}
