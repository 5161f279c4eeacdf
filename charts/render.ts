/**
 * Headless rendering of chart.js figures through @napi-rs/canvas (Skia, no system libraries):
 * PNG, SVG (text kept as editable `<text>`, see svgText.ts; shapes compacted, svgShapes.ts) and
 * PDF (vector, fonts embedded).
 * The DejaVu fonts ship as an npm package, so figures do not depend on what fonts a machine has.
 */

import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts, PDFDocument, type SKRSContext2D, SvgExportFlag } from '@napi-rs/canvas';
import { Chart, type ChartConfiguration, type Plugin, registerables } from 'chart.js';
import { InputError } from '../src/index.js';
import { FONT_FAMILY } from './style.js';
import { compactShapes } from './svgShapes.js';
import { editableSvg } from './svgText.js';

export { FONT_FAMILY } from './style.js';

/** Output formats, chosen by file extension. */
export type FigureFormat = 'png' | 'svg' | 'pdf';

/** Size and format of a figure. */
export interface FigureOptions {
  readonly format: FigureFormat;
  /** Width in CSS pixels (1/96 in). @default 900 */
  readonly width?: number;
  /** Height in CSS pixels. @default 650 */
  readonly height?: number;
  /** PNG pixels per CSS pixel. @default 2 */
  readonly pngScale?: number;
  /** PDF document title. */
  readonly title?: string;
}

let ready = false;

function setUp(): void {
  if (ready) return;
  const require = createRequire(import.meta.url);
  for (const file of ['DejaVuSans.ttf', 'DejaVuSans-Bold.ttf', 'DejaVuSans-Oblique.ttf']) {
    GlobalFonts.registerFromPath(require.resolve(`dejavu-fonts-ttf/ttf/${file}`), FONT_FAMILY);
  }
  Chart.register(...registerables);
  Chart.defaults.font.family = FONT_FAMILY;
  Chart.defaults.color = '#222222';
  ready = true;
}

/**
 * The format of an output path from its extension.
 * @throws InputError for an extension other than .png, .svg or .pdf.
 */
export function formatOfPath(path: string): FigureFormat {
  const ext = /\.([^./\\]+)$/.exec(path)?.[1]?.toLowerCase();
  if (ext === 'png' || ext === 'svg' || ext === 'pdf') return ext;
  throw new InputError(`output file "${path}": expected a .png, .svg or .pdf extension`);
}

const whiteBackground: Plugin = {
  id: 'termsplitBackground',
  beforeDraw(chart) {
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

/**
 * Renders a chart.js configuration to the bytes of a PNG, SVG or PDF file. Animation and
 * responsiveness are switched off; a white background is drawn.
 */
export function renderChart(config: ChartConfiguration, options: FigureOptions): Buffer {
  setUp();
  const width = options.width ?? 900;
  const height = options.height ?? 650;
  const withDefaults = (ratio: number): ChartConfiguration => ({
    ...config,
    options: { ...config.options, animation: false, responsive: false, devicePixelRatio: ratio },
    plugins: [whiteBackground, ...(config.plugins ?? [])],
  });
  if (options.format === 'png') {
    // chart.js enlarges the canvas itself by devicePixelRatio and scales the drawing to match.
    const canvas = createCanvas(width, height);
    return drawOn(canvas, withDefaults(options.pngScale ?? 2), () => canvas.toBuffer('image/png'));
  }
  if (options.format === 'svg') {
    const canvas = createCanvas(width, height, SvgExportFlag.NoPrettyXML);
    return drawOn(canvas, withDefaults(1), () =>
      Buffer.from(compactShapes(editableSvg(canvas.getContent().toString('utf8'))), 'utf8'),
    );
  }
  const doc = new PDFDocument({ title: options.title ?? 'termsplit figure', creator: 'termsplit' });
  const ctx = doc.beginPage(width, height) as unknown as SKRSContext2D;
  // chart.js asks its item for a 2D context and reads the context's canvas for the size; a PDF
  // page context has no canvas, so it gets a stand-in of the page size.
  const page = { width, height, style: {}, getContext: () => ctx };
  Object.defineProperty(ctx, 'canvas', { value: page, configurable: true });
  return drawOn(page, withDefaults(1), () => {
    doc.endPage();
    return doc.close();
  });
}

/** Draws the chart, takes the file bytes with `collect`, then frees the chart (which clears the canvas). */
function drawOn(item: object, config: ChartConfiguration, collect: () => Buffer): Buffer {
  const chart = new Chart(item as unknown as ConstructorParameters<typeof Chart>[0], config);
  try {
    return collect();
  } finally {
    chart.destroy();
  }
}
