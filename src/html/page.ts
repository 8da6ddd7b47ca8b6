/**
 * The HTML page every fray report shares: one self-contained document (inline CSS and
 * SVG, no scripts, nothing fetched), written as well-formed XHTML-compatible markup so it
 * also parses as XML. Sections are built from escaped text and the SVG of src/plots.
 */
import { FONT, INK } from '../plots/palette.js';

/** Escapes text for HTML/XML element content and attribute values. */
export function esc(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** One section of a report page: a heading, optional note, and its already-built HTML body. */
export interface PageSection {
  readonly id: string;
  readonly heading: string;
  readonly note?: string;
  readonly body: string;
}

/** A key–value table (the report's header); values are escaped here. */
export function keyValueList(rows: readonly (readonly [string, string])[]): string {
  return `<dl class="facts">${rows.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join('')}</dl>`;
}

/** A table with a header row; cells are escaped, `numeric` columns right-aligned in tabular figures. */
export function table(head: readonly string[], rows: readonly (readonly string[])[], numeric: readonly number[] = [], cls = ''): string {
  const cell = (tag: string, v: string, i: number) => `<${tag}${numeric.includes(i) ? ' class="num"' : ''}>${esc(v)}</${tag}>`;
  return (
    `<table${cls !== '' ? ` class="${esc(cls)}"` : ''}><thead><tr>${head.map((h, i) => cell('th', h, i)).join('')}</tr></thead>` +
    `<tbody>${rows.map((r) => `<tr>${r.map((v, i) => cell('td', v, i)).join('')}</tr>`).join('')}</tbody></table>`
  );
}

/** A figure holding one SVG picture and its caption. */
export function figure(svg: string, caption: string): string {
  return `<figure>${svg}<figcaption>${esc(caption)}</figcaption></figure>`;
}

/** Two blocks side by side (a chart and its table), stacked on narrow screens. */
export function pair(left: string, right: string): string {
  return `<div class="pair"><div>${left}</div><div>${right}</div></div>`;
}

/** The whole page: title, subtitle, sections, footer. */
export function page(title: string, subtitle: string, sections: readonly PageSection[], footer: string): string {
  const body = sections
    .map((s) => `<section id="${esc(s.id)}"><h2>${esc(s.heading)}</h2>${s.note !== undefined ? `<p class="note">${esc(s.note)}</p>` : ''}${s.body}</section>`)
    .join('\n');
  return `<!DOCTYPE html>
<html xmlns="http://www.w3.org/1999/xhtml" lang="en">
<head>
<meta charset="utf-8"/>
<meta name="viewport" content="width=device-width, initial-scale=1"/>
<title>${esc(title)}</title>
<style>${CSS}</style>
</head>
<body>
<header><p class="kicker">fray report</p><h1>${esc(title)}</h1><p class="sub">${esc(subtitle)}</p></header>
<main>
${body}
</main>
<footer>${esc(footer)}</footer>
</body>
</html>
`;
}

/** The page's own look: a paper-like column, figures framed, numbers in tabular figures; prints in black on white. */
const CSS = `
:root { --ink: ${INK}; --muted: #5d5850; --paper: #f7f4ee; --card: #ffffff; --line: #d9d3c7; --accent: #8a3b12; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink); font: 15px/1.5 ${FONT}; }
header, main, footer { max-width: 1060px; margin: 0 auto; padding: 0 28px; }
header { padding-top: 28px; border-bottom: 3px double var(--line); padding-bottom: 14px; }
.kicker { margin: 0; text-transform: uppercase; letter-spacing: 0.14em; font-size: 12px; color: var(--accent); }
h1 { margin: 4px 0 2px; font: 600 28px/1.2 Georgia, 'Times New Roman', serif; }
.sub { margin: 0; color: var(--muted); }
h2 { font: 600 19px/1.3 Georgia, 'Times New Roman', serif; margin: 30px 0 6px; padding-bottom: 4px; border-bottom: 1px solid var(--line); }
.note { margin: 0 0 10px; color: var(--muted); font-size: 13.5px; max-width: 80ch; }
.facts { display: grid; grid-template-columns: max-content 1fr; gap: 3px 18px; margin: 14px 0 0; }
.facts dt { color: var(--muted); }
.facts dd { margin: 0; }
.cards { display: grid; grid-template-columns: repeat(auto-fit, minmax(220px, 1fr)); gap: 12px; }
.card { background: var(--card); border: 1px solid var(--line); border-left: 4px solid var(--ink); padding: 10px 14px; }
.card .name { font-size: 13px; color: var(--muted); }
.card .value { font: 600 24px/1.3 Menlo, Consolas, monospace; font-variant-numeric: tabular-nums; }
.card .def { font-size: 12.5px; color: var(--muted); }
figure { margin: 8px 0 0; background: var(--card); border: 1px solid var(--line); padding: 12px; overflow-x: auto; }
figure svg { display: block; max-width: none; }
figcaption { font-size: 13px; color: var(--muted); margin-top: 6px; }
.pair { display: grid; grid-template-columns: repeat(auto-fit, minmax(380px, auto)); gap: 18px; align-items: start; justify-content: start; }
table { border-collapse: collapse; margin-top: 10px; background: var(--card); font-size: 13.5px; }
th, td { border: 1px solid var(--line); padding: 3px 10px; text-align: left; }
th { background: #efebe3; font-weight: 600; }
td.num, th.num { text-align: right; font-family: Menlo, Consolas, monospace; font-variant-numeric: tabular-nums; }
details { margin-top: 10px; }
summary { cursor: pointer; color: var(--muted); }
.warnings li { color: #7a2e00; }
footer { color: var(--muted); font-size: 12.5px; padding-top: 24px; padding-bottom: 30px; }
@media print { body { background: #fff; } figure, .card, table { break-inside: avoid; } }
`;
