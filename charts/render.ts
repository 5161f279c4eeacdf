/**
 * Headless rendering of chart.js figures through @napi-rs/canvas (Skia, no system libraries):
 * PNG, SVG (text kept as editable `<text>`, see svgText.ts; shapes compacted, svgShapes.ts) and
 * PDF (vector, fonts embedded).
 * The DejaVu fonts ship as an npm package, so figures do not depend on what fonts a machine has.
 */

import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts, PDFDocument, type SKRSContext2D, SvgExportFlag } from '@napi-rs/canvas';
import { Chart, type ChartConfiguration, type Plugin, registerables } from 'chart.js';
import { ensure } from '../src/core/errors.js';
import { DEFAULT_PRESET_DPI, FIGURE_SIZES, type FigureOptions } from './figureFormat.js';
import { FONT_FAMILY } from './style.js';
import { compactShapes } from './svgShapes.js';
import { editableSvg } from './svgText.js';

export {
  DEFAULT_PRESET_DPI,
  FIGURE_SIZES,
  type FigureFormat,
  type FigureOptions,
  type FigureSize,
  formatOfPath,
} from './figureFormat.js';
export { FONT_FAMILY } from './style.js';

/** Layout size (CSS px), physical width (CSS px at 96 per inch) and PNG scale of a figure. */
function layoutOf(options: FigureOptions) {
  const width = options.width ?? 900;
  const height = options.height ?? 650;
  if (options.size === undefined) {
    const pngScale = options.dpi !== undefined ? options.dpi / 96 : (options.pngScale ?? 2);
    return { width, height, printWidth: width, pngScale };
  }
  const preset = FIGURE_SIZES[options.size];
  ensure(preset !== undefined, `figure size "${options.size}": expected one-column or two-column`);
  const designHeight = Math.round((height * preset.designWidth * preset.aspect) / width);
  const printWidth = (preset.mm / 25.4) * 96;
  const pixels = (preset.mm / 25.4) * (options.dpi ?? DEFAULT_PRESET_DPI);
  return {
    width: preset.designWidth,
    height: designHeight,
    printWidth,
    pngScale: pixels / preset.designWidth,
  };
}

/** An SVG's root sized in millimetres over its pixel drawing (viewBox), for a size preset. */
function printSize(svg: string, width: number, height: number, printWidth: number): string {
  const mm = (px: number) => `${Math.round(((px * printWidth) / width / 96) * 25.4 * 10) / 10}mm`;
  return svg.replace(
    /<svg([^>]*?) width="[^"]*" height="[^"]*"/,
    `<svg$1 width="${mm(width)}" height="${mm(height)}" viewBox="0 0 ${width} ${height}"`,
  );
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

/** Built-in chart.js plugins that draw nothing when hidden. */
const HIDEABLE = new Set(['legend', 'title', 'subtitle', 'tooltip']);

/**
 * The plugin options with the built-in legend, title and tooltip left out entirely where a figure
 * hides them (`display: false`, `enabled: false`), and decimation (figures draw every point) too:
 * a hidden legend still builds an entry for every dataset each time the chart updates.
 */
function withoutHidden(plugins: object | undefined): Record<string, unknown> {
  const out: Record<string, unknown> = { decimation: false };
  for (const [id, value] of Object.entries(plugins ?? {})) {
    const hidden =
      HIDEABLE.has(id) &&
      typeof value === 'object' &&
      value !== null &&
      (value.display === false || value.enabled === false);
    out[id] = hidden ? false : value;
  }
  return out;
}

/**
 * Renders a chart.js configuration to the bytes of a PNG, SVG or PDF file. Animation and
 * responsiveness are switched off; a white background is drawn.
 */
export function renderChart(config: ChartConfiguration, options: FigureOptions): Buffer {
  setUp();
  ensure(
    options.dpi === undefined || (Number.isFinite(options.dpi) && options.dpi >= 30 && options.dpi <= 2400),
    `PNG resolution ${options.dpi} dpi: expected a number from 30 to 2400`,
  );
  const { width, height, printWidth, pngScale } = layoutOf(options);
  const withDefaults = (ratio: number): ChartConfiguration => ({
    ...config,
    options: {
      ...config.options,
      plugins: withoutHidden(config.options?.plugins) as NonNullable<
        ChartConfiguration['options']
      >['plugins'],
      animation: false,
      responsive: false,
      devicePixelRatio: ratio,
    },
    plugins: [whiteBackground, ...(config.plugins ?? [])],
  });
  if (options.format === 'png') {
    // chart.js enlarges the canvas itself by devicePixelRatio and scales the drawing to match.
    const canvas = createCanvas(width, height);
    return drawOn(canvas, withDefaults(pngScale), () => canvas.toBuffer('image/png'));
  }
  if (options.format === 'svg') {
    const canvas = createCanvas(width, height, SvgExportFlag.NoPrettyXML);
    return drawOn(canvas, withDefaults(1), () => {
      const svg = compactShapes(editableSvg(canvas.getContent().toString('utf8')));
      return Buffer.from(options.size ? printSize(svg, width, height, printWidth) : svg, 'utf8');
    });
  }
  const doc = new PDFDocument({ title: options.title ?? 'termsplit figure', creator: 'termsplit' });
  // A PDF page is measured in points (1/72 in): the drawing is scaled to the printed width.
  const points = (printWidth / width) * 0.75;
  const ctx = doc.beginPage(width * points, height * points) as unknown as SKRSContext2D;
  // chart.js asks its item for a 2D context and reads the context's canvas for the size; a PDF
  // page context has no canvas, so it gets a stand-in of the page size.
  const page = { width, height, style: {}, getContext: () => ctx };
  Object.defineProperty(ctx, 'canvas', { value: page, configurable: true });
  return drawOn(page, withDefaults(points), () => {
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
