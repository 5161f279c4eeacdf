/**
 * A curve given at increasing x, resampled onto an even grid: each new value is the mean of the
 * piecewise-linear curve over a slot of one step centred on its point, so the area is kept.
 * Beyond the data the curve falls linearly to zero over one more original step.
 *
 * Written here although ml-spectra-processing (xyEquallySpaced, variant "smooth") computes the
 * same numbers, because importing that package loads some two hundred modules, about 0.2 s at
 * every start of the spectrum command, for this one function; the test checks the two agree.
 */

/** The even grid of `count` ≥ 2 points from `from` to `to` and the slot means there. */
export function resampleEvenly(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  from: number,
  to: number,
  count: number,
): { x: Float64Array; y: Float64Array } {
  const step = (to - from) / (count - 1);
  const gx = new Float64Array(count);
  for (let j = 0; j < count; j++) gx[j] = from + step * j;
  return { x: gx, y: slotMeans(x, y, from, step, count) };
}

/** ∫ (slope·t + intercept) dt from x0 to x1. */
function integral(x0: number, x1: number, slope: number, intercept: number): number {
  return 0.5 * slope * x1 * x1 + intercept * x1 - (0.5 * slope * x0 * x0 + intercept * x0);
}

/**
 * Walks the data segments and the output slots together, keeping the running integral of the
 * curve; each slot mean is the integral's rise across the slot over the step.
 */
function slotMeans(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  from: number,
  step: number,
  count: number,
): Float64Array {
  const n = x.length;
  const out = new Float64Array(count);
  const lastStep = (x[n - 1] as number) - (x[n - 2] as number);
  let min = from - step / 2;
  let max = from + step / 2;
  let previousX = Number.MIN_SAFE_INTEGER;
  let previousY = 0;
  let nextX = (x[0] as number) - ((x[1] as number) - (x[0] as number));
  let nextY = 0;
  let total = 0;
  let slope = 0;
  let intercept = 0;
  let atMin = 0;
  let i = 0;
  let j = 0;
  for (;;) {
    if (previousX <= min && min <= nextX) atMin = total + integral(0, min - previousX, slope, previousY);
    while (nextX - max >= 0) {
      const atMax = total + integral(0, max - previousX, slope, previousY);
      out[j++] = (atMax - atMin) / step;
      if (j === count) return out;
      min = max;
      max += step;
      atMin = atMax;
    }
    total += integral(previousX, nextX, slope, intercept);
    previousX = nextX;
    previousY = nextY;
    if (i < n) {
      nextX = x[i] as number;
      nextY = y[i] as number;
      i++;
    } else {
      nextX += lastStep;
      nextY = 0;
    }
    slope = (nextY - previousY) / (nextX - previousX);
    intercept = -slope * previousX + previousY;
  }
}
