import type { CliIO } from './main.js';
import { writeOutputFile } from './outputFiles.js';

/**
 * `--html FILE` of every command that draws a page: builds the page only when asked, writes
 * it whole or not at all (an unwritable path is a usage error, exit 2), and says where it went.
 */
export async function writeHtmlReport(opts: Record<string, unknown>, io: CliIO, build: () => Promise<string>): Promise<void> {
  const path = opts['html'] as string | undefined;
  if (path === undefined) return;
  writeOutputFile('--html', path, await build());
  io.stderr.write(`fray: wrote the HTML report to ${path}\n`);
}
