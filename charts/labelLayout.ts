/**
 * Placement of labels without overlap: a one-dimensional spread for a column of labels that
 * must all be shown (each kept as close to its target as the others allow), and a search for a
 * free spot for labels that may be left out.
 */

/** An axis-aligned box in canvas pixels. */
export interface Box {
  readonly left: number;
  readonly top: number;
  readonly right: number;
  readonly bottom: number;
}

/** Whether two boxes overlap (touching edges do not count). */
export function overlaps(a: Box, b: Box): boolean {
  return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/**
 * Positions along one axis for labels of extent `gap` each, as near their targets as possible,
 * no two closer than `gap`, all within [lo, hi] where there is room: the labels are sorted by
 * target, and overlapping runs are merged into blocks centred on the mean of their targets until
 * none overlap (the usual way direct labels are spread; least squares within each block).
 * Returns the positions in the order of `targets`.
 */
export function spreadLabels(targets: readonly number[], gap: number, lo: number, hi: number): number[] {
  const order = targets.map((_, i) => i).sort((a, b) => (targets[a] ?? 0) - (targets[b] ?? 0));
  interface Block {
    items: number[];
    start: number;
  }
  const place = (items: number[]): number => {
    // Best start of a block: the mean of target − offset, kept inside [lo, hi].
    let sum = 0;
    items.forEach((item, k) => {
      sum += (targets[item] ?? 0) - k * gap;
    });
    const best = sum / items.length;
    const last = hi - (items.length - 1) * gap;
    return Math.max(lo, Math.min(best, Math.max(lo, last)));
  };
  let blocks: Block[] = order.map((i) => ({ items: [i], start: place([i]) }));
  let merged = true;
  while (merged) {
    merged = false;
    const next: Block[] = [];
    for (const b of blocks) {
      const prev = next[next.length - 1];
      if (prev && prev.start + prev.items.length * gap > b.start) {
        prev.items.push(...b.items);
        prev.start = place(prev.items);
        merged = true;
      } else next.push({ items: [...b.items], start: b.start });
    }
    blocks = next;
  }
  const out = new Array<number>(targets.length).fill(0);
  for (const b of blocks) {
    b.items.forEach((item, k) => {
      out[item] = b.start + k * gap;
    });
  }
  return out;
}

/**
 * The first of `box` moved by each offset in `shifts` (pixels along y) that overlaps none of
 * `taken` and stays inside `bounds`, or undefined.
 */
export function freeSpot(
  box: Box,
  taken: readonly Box[],
  shifts: readonly number[],
  bounds: Box,
): Box | undefined {
  for (const dy of shifts) {
    const moved = { left: box.left, right: box.right, top: box.top + dy, bottom: box.bottom + dy };
    if (moved.top < bounds.top || moved.bottom > bounds.bottom) continue;
    if (!taken.some((t) => overlaps(moved, t))) return moved;
  }
  return undefined;
}

/** Offsets 0, +1, −1, +2, −2, … up to ±max in steps of `step`. */
export function nearShifts(max: number, step = 1): number[] {
  const out = [0];
  for (let d = step; d <= max; d += step) out.push(d, -d);
  return out;
}
