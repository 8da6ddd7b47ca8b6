/** Terminal styling: ANSI colour only when wanted (a TTY, no NO_COLOR, no --no-color). */
export interface Style {
  bold(s: string): string;
  dim(s: string): string;
  red(s: string): string;
  yellow(s: string): string;
  green(s: string): string;
  cyan(s: string): string;
}

const wrap = (open: number, close: number) => (s: string) => `\u001b[${open}m${s}\u001b[${close}m`;

/** A Style that colours (on) or passes text through (off). */
export function makeStyle(on: boolean): Style {
  if (!on) {
    const id = (s: string) => s;
    return { bold: id, dim: id, red: id, yellow: id, green: id, cyan: id };
  }
  return { bold: wrap(1, 22), dim: wrap(2, 22), red: wrap(31, 39), yellow: wrap(33, 39), green: wrap(32, 39), cyan: wrap(36, 39) };
}

/** Whether to colour a stream: it is a TTY, NO_COLOR is unset or empty, and --no-color was not given. */
export function wantColor(stream: NodeJS.WriteStream, flag: boolean): boolean {
  const noColor = process.env['NO_COLOR'];
  return flag && stream.isTTY === true && (noColor === undefined || noColor === '');
}
