/**
 * Smaller SVG shapes. Skia writes a curve of a few hundred sweep points as one long polyline
 * with five-decimal coordinates, and every round marker as some forty quadratic pieces. Here a
 * polyline loses the points that lie within {@link POLYLINE_TOLERANCE} px of the line through
 * its neighbours (Ramer–Douglas–Peucker: D. H. Douglas and T. K. Peucker, Cartographica 10,
 * 112–122, 1973), a path made only of quadratic pieces around a square box becomes a `<circle>`,
 * and path coordinates keep one decimal (a tenth of a pixel, finer than any print shows).
 * Skia writes a clip path and a group for every clipped drawing call; neighbouring groups with
 * the same clip rectangle (the curves of a diagram, one dataset each) become one group.
 */

/** Largest distance, px, of a dropped polyline point from the simplified line. */
export const POLYLINE_TOLERANCE = 0.12;

type Point = readonly [number, number];

/** Distance of p from the segment a–b. */
function offSegment(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
}

/** The points of a polyline kept by Ramer–Douglas–Peucker (iterative, so long curves cannot overflow the stack). */
function simplify(points: readonly Point[], tolerance: number): Point[] {
  const keep = new Uint8Array(points.length);
  keep[0] = 1;
  keep[points.length - 1] = 1;
  const stack: [number, number][] = [[0, points.length - 1]];
  while (stack.length > 0) {
    const [i, j] = stack.pop() as [number, number];
    let worst = -1;
    let at = -1;
    for (let k = i + 1; k < j; k++) {
      const d = offSegment(points[k] as Point, points[i] as Point, points[j] as Point);
      if (d > worst) {
        worst = d;
        at = k;
      }
    }
    if (worst > tolerance) {
      keep[at] = 1;
      stack.push([i, at], [at, j]);
    }
  }
  return points.filter((_, k) => keep[k] === 1);
}

const num = (v: number) => String(Math.round(v * 10) / 10);

/** A polyline path (M then L only) simplified, or undefined for any other path. */
function polyline(d: string): string | undefined {
  if (!/^M[-\d.e ]+(L[-\d.e ]+)+$/.test(d)) return undefined;
  const points = [...d.matchAll(/[ML]\s*(-?[\d.e-]+)\s+(-?[\d.e-]+)/g)].map(
    (m) => [Number(m[1]), Number(m[2])] as const,
  );
  if (points.length < 3) return undefined;
  const kept = simplify(points, POLYLINE_TOLERANCE);
  return kept.map((p, k) => `${k === 0 ? 'M' : 'L'}${num(p[0])} ${num(p[1])}`).join('');
}

/** Centre and radius of a path made only of quadratic pieces that closes on itself around a square box. */
function circle(d: string): { cx: number; cy: number; r: number } | undefined {
  if (!/^M[-\d.e ]+(Q[-\d.e ]+){8,}Z?$/.test(d)) return undefined;
  const values = [...d.matchAll(/-?[\d.]+(?:e-?\d+)?/g)].map((m) => Number(m[0]));
  const xs = values.filter((_, k) => k % 2 === 0);
  const ys = values.filter((_, k) => k % 2 === 1);
  const [x0, y0] = [xs[0] ?? 0, ys[0] ?? 0];
  const [x1, y1] = [xs.at(-1) ?? 0, ys.at(-1) ?? 0];
  const w = Math.max(...xs) - Math.min(...xs);
  const h = Math.max(...ys) - Math.min(...ys);
  if (Math.hypot(x1 - x0, y1 - y0) > 0.05 * w || Math.abs(w - h) > 0.05 * w) return undefined;
  return { cx: Math.min(...xs) + w / 2, cy: Math.min(...ys) + h / 2, r: w / 2 };
}

/** A group clipped to a rectangle, holding no group of its own (the first `</g>` closes it). */
const CLIP_GROUP =
  /<clipPath id="([^"]+)">(<rect [^>]*\/>)<\/clipPath><g clip-path="url\(#\1\)">(.*?)<\/g>/gs;

/** An SVG whose neighbouring groups clipped to the same rectangle are joined into the first of them. */
export function mergeClipGroups(svg: string): string {
  let out = '';
  let copied = 0;
  let open: { head: string; rect: string; body: string; end: number } | undefined;
  const close = () => {
    if (open) out += `${open.head}${open.body}</g>`;
    open = undefined;
  };
  for (const m of svg.matchAll(CLIP_GROUP)) {
    const [whole, , rect = '', body = ''] = m;
    if (body.includes('<g')) continue;
    if (open && open.end === m.index && open.rect === rect) {
      open.body += body;
      open.end += whole.length;
      copied = open.end;
      continue;
    }
    close();
    out += svg.slice(copied, m.index);
    open = { head: whole.slice(0, whole.length - body.length - 4), rect, body, end: m.index + whole.length };
    copied = open.end;
  }
  close();
  return out + svg.slice(copied);
}

/** An SVG with its paths simplified, its round markers written as circles and its clip groups joined (see the module comment). */
export function compactShapes(svg: string): string {
  return mergeClipGroups(svg).replace(
    /<path ([^>]*?)d="([^"]*)"([^>]*?)\/>/g,
    (whole, before: string, d: string, after: string) => {
      const round = circle(d);
      if (round)
        return `<circle ${before}cx="${num(round.cx)}" cy="${num(round.cy)}" r="${Math.round(round.r * 100) / 100}"${after}/>`;
      const line = polyline(d);
      if (line) return `<path ${before}d="${line}"${after}/>`;
      return whole.replace(/d="[^"]*"/, (attr) => attr.replace(/(\d\.\d)\d+/g, '$1'));
    },
  );
}
