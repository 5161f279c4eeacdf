/**
 * The report's blocks written as Markdown (figures linked as files), as one self-contained HTML
 * page (figures embedded as SVG, styles inline, no scripts, opens in any browser with no
 * server), and each table as CSV.
 */

import { formulaTextHtml } from '../../charts/typeset.js';
import { csvText } from '../../src/sheets/csv.js';
import type { Block, TableBlock } from './document.js';

/** Control characters (NUL, line breaks, escape codes; C0, DEL and C1) become spaces: one line of text. */
function oneLine(text: string): string {
  // biome-ignore lint/suspicious/noControlCharactersInRegex: the control characters are the point
  return text.replace(/[\u0000-\u001f\u007f-\u009f]/g, ' ');
}

/**
 * Plain text for Markdown: every character with a meaning there (emphasis, code, links, raw
 * HTML, table pipes) backslash-escaped, `&` as an entity, and the marks of a heading, quote or
 * list at the start escaped, so a title or sample name shows as written and never as markup.
 */
export function mdEscape(text: string): string {
  return oneLine(text)
    .replace(/[\\`*_[\]<>|~!]/g, (c) => `\\${c}`)
    .replace(/&/g, '&amp;')
    .replace(/^(\s*)([#>+=-]|\d+[.)])/, (_, space: string, mark: string) => `${space}\\${mark}`);
}

/** Markdown of the blocks. */
export function toMarkdown(blocks: readonly Block[]): string {
  const out: string[] = [];
  for (const b of blocks) {
    switch (b.kind) {
      case 'heading':
        out.push(`${'#'.repeat(b.level)} ${mdEscape(b.text)}`);
        break;
      case 'paragraph':
        out.push(mdEscape(b.text));
        break;
      case 'note':
        out.push(`> **${mdEscape(b.text)}**`);
        break;
      case 'list':
        out.push(b.items.map((i) => `- ${mdEscape(i)}`).join('\n'));
        break;
      case 'table':
        out.push(
          [
            `| ${b.headers.map(mdEscape).join(' | ')} |`,
            `| ${b.headers.map(() => '---').join(' | ')} |`,
            ...b.rows.map((r) => `| ${r.map(mdEscape).join(' | ')} |`),
          ].join('\n'),
        );
        break;
      case 'link':
        out.push(`[${mdEscape(b.text)}](${encodeURI(b.href)})`);
        break;
      case 'figure':
        out.push(`![${mdEscape(b.caption)}](${encodeURI(b.path)})\n\n*${mdEscape(b.caption)}*`);
        break;
    }
  }
  return `${out.join('\n\n')}\n`;
}

/** Text as HTML with its formulae typeset, escaped, control characters as spaces. */
function typesetHtml(text: string): string {
  return formulaTextHtml(oneLine(text)).replace(/'/g, '&#39;');
}

/** Escapes text for HTML content and attribute values; control characters become spaces. */
export function htmlEscape(text: string): string {
  return oneLine(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** The SVG element of an SVG document, for inlining (the XML declaration dropped, a role and title added). */
function inlineSvg(svg: string, caption: string): string {
  const start = svg.indexOf('<svg');
  const body = start >= 0 ? svg.slice(start) : svg;
  return body.replace(/<svg\b/, `<svg role="img" aria-label="${htmlEscape(caption)}"`);
}

const STYLE = `
body { font-family: "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; color: #222; margin: 2rem auto; max-width: 64rem; padding: 0 1rem; line-height: 1.45; }
h1 { font-size: 1.7rem; } h2 { font-size: 1.35rem; border-bottom: 1px solid #ccd; padding-bottom: .2rem; margin-top: 2.2rem; } h3 { font-size: 1.12rem; margin-top: 1.8rem; }
table { border-collapse: collapse; margin: .6rem 0 1rem; font-size: .92rem; }
th, td { border-bottom: 1px solid #dde; padding: .25rem .6rem; text-align: left; vertical-align: top; }
th { background: #f2f4f7; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
.note { background: #fff4e0; border-left: 4px solid #d08a1e; padding: .6rem .9rem; }
figure { margin: 1rem 0 1.6rem; } figure svg { width: 100%; height: auto; border: 1px solid #eee; }
figcaption { font-size: .9rem; color: #555; margin-top: .3rem; }
ul { padding-left: 1.3rem; } li { margin: .2rem 0; }
`;

const NUMERIC = /^[-+−]?[\d.,]+( ± [\d.,]+)?$|^—$/;

/** One self-contained HTML page of the blocks. */
export function toHtml(blocks: readonly Block[], title: string): string {
  const body: string[] = [];
  for (const b of blocks) {
    switch (b.kind) {
      case 'heading':
        body.push(
          `<h${b.level}${b.id ? ` id="${htmlEscape(b.id)}"` : ''}>${typesetHtml(b.text)}</h${b.level}>`,
        );
        break;
      case 'paragraph':
        body.push(`<p>${htmlEscape(b.text)}</p>`);
        break;
      case 'note':
        body.push(`<p class="note"><strong>${htmlEscape(b.text)}</strong></p>`);
        break;
      case 'list':
        body.push(`<ul>${b.items.map((i) => `<li>${htmlEscape(i)}</li>`).join('')}</ul>`);
        break;
      case 'table':
        body.push(
          `<table><thead><tr>${b.headers.map((h) => `<th>${typesetHtml(h)}</th>`).join('')}</tr></thead><tbody>` +
            b.rows
              .map(
                (r) =>
                  `<tr>${r.map((c) => `<td${NUMERIC.test(c) ? ' class="num"' : ''}>${typesetHtml(c)}</td>`).join('')}</tr>`,
              )
              .join('') +
            '</tbody></table>',
        );
        break;
      case 'link':
        body.push(`<p><a href="${htmlEscape(encodeURI(b.href))}">${htmlEscape(b.text)}</a></p>`);
        break;
      case 'figure':
        body.push(
          `<figure>${inlineSvg(b.svg, b.caption)}<figcaption>${typesetHtml(b.caption)}</figcaption></figure>`,
        );
        break;
    }
  }
  return (
    '<!DOCTYPE html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n' +
    `<meta name="viewport" content="width=device-width, initial-scale=1">\n<title>${htmlEscape(title)}</title>\n` +
    `<style>${STYLE}</style>\n</head>\n<body>\n${body.join('\n')}\n</body>\n</html>\n`
  );
}

/** CSV text of a table (header row, then the rows; UTF-8). */
export function toCsv(table: TableBlock): string {
  return csvText([table.headers, ...table.rows]);
}
