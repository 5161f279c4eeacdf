/**
 * Decomposition of an evenly resampled absorption window into Gaussian bands plus a straight
 * baseline, in scaled units (x in kK, y divided by its largest magnitude), for
 * `findBands` (bandFinding.ts), which owns the units, the window and the report.
 *
 * 1. Candidates: minima of the Savitzky–Golay second derivative that lie clearly below its
 *    noise, at a fine and a coarse scale. A maximum and a shoulder alike make such a minimum
 *    (the classical use of second-derivative spectra to find overlapping bands).
 * 2. The clearest candidates (as many as bands are allowed) are fitted together, heights
 *    first by linear least squares, then every parameter by Levenberg–Marquardt, with an edge
 *    band at each end toward which the data rise; the weakest band is removed and the rest
 *    refitted until every band is significant.
 * 3. Bands are then added one at a time where the model still leaves signal — remaining
 *    candidates, and one Gaussian centred beyond each end of the window for a band whose
 *    maximum lies outside it — keeping an addition only when it lowers the sum of squares
 *    significantly and every band stays significant.
 * 4. A last fit to full convergence gives the reported parameters.
 *
 * Candidates come from the second derivative itself rather than from ml-gsd's peak picking:
 * gsd returns a peak only between two inflection points it finds in the first derivative, so
 * it misses a band whose inflection lies beyond the window's end and a shoulder that makes no
 * extremum of its own in the first derivative, the very bands d–d spectra are full of.
 */

import { sgg } from 'ml-savitzky-golay-generalized';
import { qrLeastSquares } from '../numeric/householderQr.js';
import { type CurveModel, covariance, fitCurve } from '../numeric/leastSquares.js';
import { FOUR_LN2 } from './gaussianBands.js';

/** The baseline fitted with the bands. */
export type BaselineKind = 'none' | 'constant' | 'linear';

/** Where a component's maximum lies: inside the window, or beyond its blue or red end. */
export type ComponentKind = 'inside' | 'blue-edge' | 'red-edge';

/** A Gaussian component in scaled units: centre c and FWHM w in kK, height h in scaled y. */
export interface Component {
  readonly kind: ComponentKind;
  readonly c: number;
  readonly h: number;
  readonly w: number;
}

/** The window in kK: ends, span, narrowest FWHM looked for, grid step. */
export interface Box {
  readonly lo: number;
  readonly hi: number;
  readonly span: number;
  readonly minW: number;
  readonly step: number;
}

/** What is fitted: the data (kK, scaled y), the window, the baseline kind and its reference x. */
export interface FitContext {
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly box: Box;
  readonly baselineKind: BaselineKind;
  readonly xMid: number;
}

/** When a band counts. */
export interface Criteria {
  /** Noise standard deviation of the data, scaled y. */
  readonly sigma: number;
  /** A band must stand this many noise deviations high, and improve χ² by its square in residual variances. */
  readonly significance: number;
  /** An inside band must be at least this fraction of the tallest inside band overlapping it. */
  readonly minRelative: number;
  /** The most inside bands. */
  readonly maxBands: number;
}

/** A fitted model. */
export interface FitState {
  readonly components: readonly Component[];
  readonly b0: number;
  readonly b1: number;
  readonly chi2: number;
  /** JᵀJ at the solution (row-major), for the covariance. */
  readonly curvature?: Float64Array;
}

/** cm⁻¹ per kK: the decomposition works in kK, so positions, widths and heights are all of order one. */
export const CM_PER_KK = 1000;

/** The coarse detection scale, cm⁻¹: about half the FWHM of a typical d–d band (common practice, no source). */
export const COARSE_DETECTION_SCALE = 1500;

/**
 * The widest band fitted, cm⁻¹: d–d and charge-transfer bands of complexes are seldom broader
 * (common practice, no source); anything broader is baseline.
 */
export const MAX_FWHM = 10000;

/** Two bands whose maxima are closer than this fraction of the narrower FWHM are one band split in two. */
const MERGE_FRACTION = 0.3;
/** A second-derivative minimum is a candidate when it is this many of its noise deviations below zero. */
const CANDIDATE_SIGNIFICANCE = 3;
/**
 * Iteration limit and relative χ² tolerance of each fit: the decisions taken on a fit (is a
 * band significant?) do not change with χ² in its seventh digit.
 */
const FIT_LIMITS = { maxIterations: 100, relativeTolerance: 1e-7 } as const;
/** Final fits (each followed by pruning if a band stopped counting) before the result stands. */
const FINAL_ROUNDS = 3;
/** Limits of the final fit of the chosen bands. */
const FINAL_LIMITS = { maxIterations: 2000, relativeTolerance: 1e-13, holdAtBounds: true } as const;
/** Inside bands with less than this part of what counting needs are removed together when pruning. */
const HOPELESS = 0.25;
/** Candidates tried per round when adding; the one that lowers χ² most is kept. */
const TRIALS_PER_ROUND = 5;

interface Candidate {
  readonly kind: ComponentKind;
  readonly c: number;
  readonly w: number;
  /** How far the second derivative dips below its candidate threshold (edges: 0). */
  readonly strength: number;
}

/** Decomposes the window; `detect` is the even grid (kK, scaled y) used for candidates and scores. */
export function decompose(
  ctx: FitContext,
  detect: { readonly x: Float64Array; readonly y: Float64Array },
  criteria: Criteria,
): FitState {
  const { box } = ctx;
  const inside = pickCandidates(detect.x, detect.y, box, criteria.sigma);
  const edgeWidth = Math.min(MAX_FWHM / (2 * CM_PER_KK), Math.max(2 * box.minW, box.span / 4));
  const edges: Candidate[] = [
    { kind: 'blue-edge', c: box.hi + edgeWidth / 2, w: edgeWidth, strength: 0 },
    { kind: 'red-edge', c: box.lo - edgeWidth / 2, w: edgeWidth, strength: 0 },
  ];
  const rising = risingEnds(detect.y, box, criteria);
  // The clearest candidates start the joint fit; the others wait for the adding stage, so a
  // noisy or rippled spectrum does not start a fit with dozens of bands.
  const clearest = [...inside].sort((a, b) => b.strength - a.strength).slice(0, criteria.maxBands);
  const start = [...clearest, ...edges.filter((e) => rising.includes(e.kind))];
  const joint = prune(ctx, fitAll(ctx, initialComponents(ctx, start), undefined), criteria);
  const used = (c: Candidate) =>
    joint.components.some(
      (k) => k.kind === c.kind && (c.kind !== 'inside' || Math.abs(k.c - c.c) < MERGE_FRACTION * k.w),
    );
  const rest = [...inside, ...edges].filter((c) => !used(c));
  let found = prune(ctx, addBands(ctx, detect, rest, criteria, joint), criteria);
  // The decisions above need χ² only to a few digits; the reported parameters get a final fit
  // run to full convergence, which matters along the shallow valleys that correlated bands
  // (a band beside an edge) leave. Should a band stop counting there, pruning resumes.
  for (let round = 1; ; round++) {
    const b = baselineOf(found, ctx.baselineKind);
    const final = fitAll(ctx, { components: found.components, b }, found, FINAL_LIMITS);
    if (round === FINAL_ROUNDS || strengths(ctx, final, criteria).every((v) => v >= 1)) return final;
    found = prune(ctx, final, criteria);
  }
}

/**
 * The ends of the window toward which the data rise: over the last twentieth of the window the
 * smoothed data climb by more than `significance` noise deviations. Only there does the first
 * joint fit start with an edge band; elsewhere one may still be added later.
 */
function risingEnds(y: Float64Array, box: Box, criteria: Criteria): ComponentKind[] {
  const smooth = sgg(y, box.step, {
    windowSize: sgWindow(box.minW, box, y.length),
    polynomial: 2,
    derivative: 0,
  });
  const k = Math.max(2, Math.round(y.length / 20));
  const climb = criteria.significance * criteria.sigma;
  const out: ComponentKind[] = [];
  if ((smooth[smooth.length - 1] as number) - (smooth[smooth.length - 1 - k] as number) > climb)
    out.push('blue-edge');
  if ((smooth[0] as number) - (smooth[k] as number) > climb) out.push('red-edge');
  return out;
}

/** An odd Savitzky–Golay window of about `scale` (kK) in grid points, from 5 to a third of the grid. */
function sgWindow(scale: number, box: Box, n: number): number {
  const largest = Math.max(5, Math.floor(n / 3));
  return Math.min(oddAtLeast(5, Math.round(scale / box.step)), largest % 2 === 1 ? largest : largest - 1);
}

function oddAtLeast(min: number, v: number): number {
  const n = Math.max(min, v);
  return n % 2 === 1 ? n : n + 1;
}

function indexAt(x: number, box: Box, n: number): number {
  return Math.min(n - 1, Math.max(0, Math.round((x - box.lo) / box.step - 0.5)));
}

/**
 * Candidate bands inside the window: minima of the cubic Savitzky–Golay second derivative
 * lying more than {@link CANDIDATE_SIGNIFICANCE} of its own noise deviations below zero, the
 * deepest first, at the fine scale (the narrowest FWHM) and then the coarse one; a minimum
 * closer to a kept one than the scale allows is the same band. The starting FWHM comes from
 * the second derivative's zero crossings, which for a Gaussian lie ±σ from the maximum
 * (FWHM = 2σ √(2 ln 2)).
 */
function pickCandidates(X: Float64Array, Y: Float64Array, box: Box, sigma: number): Candidate[] {
  const out: Candidate[] = [];
  for (const scale of [box.minW, COARSE_DETECTION_SCALE / CM_PER_KK]) {
    const windowSize = sgWindow(scale, box, X.length);
    const dd = sgg(Y, box.step, { windowSize, polynomial: 3, derivative: 2 });
    const threshold = CANDIDATE_SIGNIFICANCE * sigma * sgNoiseGain(windowSize, box.step);
    const minima: { i: number; depth: number }[] = [];
    for (let i = 1; i + 1 < dd.length; i++) {
      const d = dd[i] as number;
      if (d < -threshold && d <= (dd[i - 1] as number) && d <= (dd[i + 1] as number))
        minima.push({ i, depth: d });
    }
    minima.sort((a, b) => a.depth - b.depth);
    const separation = Math.max(MERGE_FRACTION * box.minW, scale / 2);
    for (const { i, depth } of minima) {
      const c = X[i] as number;
      if (c <= box.lo + box.step || c >= box.hi - box.step) continue;
      if (out.some((o) => Math.abs(o.c - c) < separation)) continue;
      let left = i;
      while (left > 0 && (dd[left - 1] as number) < 0) left--;
      let right = i;
      while (right + 1 < dd.length && (dd[right + 1] as number) < 0) right++;
      const w = ((X[right] as number) - (X[left] as number)) * Math.sqrt(2 * Math.LN2);
      out.push({
        kind: 'inside',
        c,
        w: Math.min(box.span / 2, Math.max(box.minW, w)),
        strength: -depth / threshold,
      });
    }
  }
  return out;
}

/**
 * How much the Savitzky–Golay second derivative amplifies white noise of unit variance: the
 * root sum of squares of its weights, read off its response to a unit impulse.
 */
function sgNoiseGain(windowSize: number, step: number): number {
  const impulse = new Float64Array(2 * windowSize + 1);
  impulse[windowSize] = 1;
  const response = sgg(impulse, step, { windowSize, polynomial: 3, derivative: 2 });
  let sum = 0;
  for (let i = windowSize - (windowSize >> 1); i <= windowSize + (windowSize >> 1); i++) {
    sum += (response[i] as number) ** 2;
  }
  return Math.sqrt(sum);
}

function baselineCount(kind: BaselineKind): number {
  return kind === 'none' ? 0 : kind === 'constant' ? 1 : 2;
}

/** Number of fitted parameters. */
export function parameterCount(components: number, kind: BaselineKind): number {
  return baselineCount(kind) + 3 * components;
}

/**
 * Components at the candidates with heights (and the baseline) from linear least squares for
 * the candidates' positions and widths; a negative height starts at zero.
 */
function initialComponents(
  ctx: FitContext,
  candidates: readonly Candidate[],
): { components: Component[]; b: number[] } {
  const nb = baselineCount(ctx.baselineKind);
  const cols = nb + candidates.length;
  if (cols === 0) return { b: [], components: [] };
  const m = ctx.x.length;
  const a = new Float64Array(m * cols);
  for (let i = 0; i < m; i++) {
    const x = ctx.x[i] as number;
    if (nb >= 1) a[i] = 1;
    if (nb === 2) a[m + i] = x - ctx.xMid;
    candidates.forEach((c, k) => {
      const u = (x - c.c) / c.w;
      a[(nb + k) * m + i] = Math.exp(-FOUR_LN2 * u * u);
    });
  }
  const solution = qrLeastSquares(a, m, cols, ctx.y);
  if (!solution) throw new Error('starting heights: the candidate band shapes are linearly dependent');
  const coef = Array.from(solution);
  return {
    b: coef.slice(0, nb),
    components: candidates.map((c, k) => ({
      kind: c.kind,
      c: c.c,
      w: c.w,
      h: Math.max(0, coef[nb + k] ?? 0),
    })),
  };
}

/** Fits every parameter together from `start` (or from a previous state's baseline). */
function fitAll(
  ctx: FitContext,
  start: { components: readonly Component[]; b: readonly number[] },
  previous: FitState | undefined,
  limits: { maxIterations: number; relativeTolerance: number; holdAtBounds?: boolean } = FIT_LIMITS,
): FitState {
  const nb = baselineCount(ctx.baselineKind);
  const p0: number[] = [];
  const min: number[] = [];
  const max: number[] = [];
  for (let k = 0; k < nb; k++) {
    p0.push(start.b[k] ?? (k === 0 ? (previous?.b0 ?? 0) : (previous?.b1 ?? 0)));
    min.push(-Infinity);
    max.push(Infinity);
  }
  for (const c of start.components) {
    p0.push(c.c, c.h, c.w);
    const [lo, hi] = componentBounds(c, ctx.box);
    min.push(...lo);
    max.push(...hi);
  }
  if (p0.length === 0) return { components: [], b0: 0, b1: 0, chi2: ctx.y.reduce((s, v) => s + v * v, 0) };
  const result = fitCurve(ctx.x, ctx.y, bandsModel(nb, ctx.xMid), p0, { min, max, ...limits });
  const p = result.p;
  return {
    b0: nb >= 1 ? (p[0] as number) : 0,
    b1: nb === 2 ? (p[1] as number) : 0,
    components: start.components.map((c, j) => ({
      kind: c.kind,
      c: p[nb + 3 * j] as number,
      h: p[nb + 3 * j + 1] as number,
      w: p[nb + 3 * j + 2] as number,
    })),
    chi2: result.chi2,
    curvature: result.curvature,
  };
}

function baselineOf(state: FitState, kind: BaselineKind): number[] {
  return kind === 'none' ? [] : kind === 'constant' ? [state.b0] : [state.b0, state.b1];
}

/**
 * Adds `added` to the model: fitted alone first to what the model leaves (its position within
 * half its width, its width within a factor of two), then every parameter together. Started
 * straight in the joint fit, a band far from its place can be pushed to zero height, where its
 * position and width no longer matter, or swell over the whole window.
 */
function fitWith(ctx: FitContext, state: FitState, added: Component): FitState {
  const before = evaluate(state, ctx.x, ctx.xMid);
  const rest = ctx.y.map((v, i) => v - (before[i] as number));
  const [lo, hi] = componentBounds(added, ctx.box);
  const local = fitCurve(ctx.x, rest, bandsModel(0, ctx.xMid), [added.c, added.h, added.w], {
    min: [Math.max(lo[0] as number, added.c - added.w / 2), 0, Math.max(lo[2] as number, added.w / 2)],
    max: [Math.min(hi[0] as number, added.c + added.w / 2), Infinity, Math.min(hi[2] as number, 2 * added.w)],
    ...FIT_LIMITS,
  }).p;
  const placed = { kind: added.kind, c: local[0] as number, h: local[1] as number, w: local[2] as number };
  return fitAll(
    ctx,
    { components: [...state.components, placed], b: baselineOf(state, ctx.baselineKind) },
    state,
  );
}

/**
 * Bounds of a component's (centre, height, FWHM): an inside band keeps its maximum in the
 * window, an edge band beyond its end by at most its widest FWHM; heights are not negative;
 * widths lie between half the narrowest FWHM looked for and {@link MAX_FWHM} (or the window).
 */
function componentBounds(c: Component | Candidate, box: Box): [number[], number[]] {
  const wMax = Math.min(MAX_FWHM / CM_PER_KK, box.span);
  const [cLo, cHi] =
    c.kind === 'inside'
      ? [box.lo, box.hi]
      : c.kind === 'blue-edge'
        ? [box.hi, box.hi + wMax]
        : [Math.max(box.lo / 2, box.lo - wMax), box.lo];
  return [
    [cLo, 0, c.kind === 'inside' ? box.minW / 2 : 2 * box.minW],
    [cHi, Infinity, wMax],
  ];
}

/**
 * The model: baseline parameters (offset, slope about `xMid`), then (centre, height, FWHM) per
 * band. Band by band over all points, so each band's constants are worked out once; every
 * point's value still sums the baseline and then the bands in order.
 */
export function bandsModel(nb: number, xMid: number): CurveModel {
  return (p, x, values, gradients) => {
    const P = p.length;
    const n = x.length;
    values.fill(0);
    for (let i = 0; i < n; i++) {
      const xi = x[i] as number;
      if (nb >= 1) {
        values[i] = (values[i] as number) + (p[0] as number);
        gradients[i] = 1;
      }
      if (nb === 2) {
        values[i] = (values[i] as number) + (p[1] as number) * (xi - xMid);
        gradients[n + i] = xi - xMid;
      }
    }
    for (let j = nb; j < P; j += 3) {
      const c = p[j] as number;
      const h = p[j + 1] as number;
      const w = p[j + 2] as number;
      const ww = w * w;
      const www = w * w * w;
      const k = 2 * FOUR_LN2 * h;
      const [dc, dh, dw] = [j * n, (j + 1) * n, (j + 2) * n];
      for (let i = 0; i < n; i++) {
        const d = (x[i] as number) - c;
        const e = Math.exp((-FOUR_LN2 * d * d) / ww);
        values[i] = (values[i] as number) + h * e;
        gradients[dc + i] = (k * e * d) / ww;
        gradients[dh + i] = e;
        gradients[dw + i] = (k * e * d * d) / www;
      }
    }
  };
}

/** The model's values at `x`. */
function evaluate(state: FitState, x: Float64Array, xMid: number): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const xi = x[i] as number;
    let v = state.b0 + state.b1 * (xi - xMid);
    for (const c of state.components) {
      const u = (xi - c.c) / c.w;
      v += c.h * Math.exp(-FOUR_LN2 * u * u);
    }
    out[i] = v;
  }
  return out;
}

/** The covariance of a state's parameters, s² (JᵀJ)⁻¹ with s² = χ² / (N − P); undefined if singular. */
export function stateCovariance(ctx: FitContext, state: FitState): Float64Array | undefined {
  const P = parameterCount(state.components.length, ctx.baselineKind);
  if (!state.curvature) return undefined;
  return covariance(state.curvature, P, state.chi2 / Math.max(1, ctx.x.length - P));
}

/**
 * How well each component counts, as a ratio (below 1 it fails): an inside band must stand
 * `significance` noise deviations high, be `minRelative` of the tallest band overlapping it,
 * have a height `significance` times its own uncertainty, keep its maximum off the window's
 * ends, not sit on a taller band's maximum, and not swell to the width bound; an edge band must
 * show `significance` noise deviations at the window's end and keep its maximum off it.
 */
function strengths(ctx: FitContext, state: FitState, criteria: Criteria): number[] {
  const { box } = ctx;
  const { sigma, significance, minRelative } = criteria;
  const nb = baselineCount(ctx.baselineKind);
  const cov = stateCovariance(ctx, state);
  const P = parameterCount(state.components.length, ctx.baselineKind);
  const inside = state.components.filter((c) => c.kind === 'inside');
  // The relative test is against the tallest band that overlaps (maxima closer than the sum of
  // the FWHMs): small components beside a big band are what model its shape; a weak band far
  // from the others (a d–d band beside a charge-transfer band) is judged by the noise alone.
  const tallestNear = (c: Component) =>
    Math.max(0, ...inside.filter((o) => Math.abs(o.c - c.c) < o.w + c.w).map((o) => o.h));
  return state.components.map((c, j) => {
    const hSigma = cov ? Math.sqrt(Math.max(0, cov[(nb + 3 * j + 1) * (P + 1)] as number)) : 0;
    const tRatio = hSigma > 0 ? c.h / hSigma / significance : Infinity;
    if (c.kind !== 'inside') {
      // Only the wing shows, so the height at the maximum (beyond the window) is poorly
      // determined even when the band is plain to see; what must stand out is its value at the end.
      const end = c.kind === 'blue-edge' ? box.hi : box.lo;
      if (Math.abs(c.c - end) < box.step) return 0;
      const u = (end - c.c) / c.w;
      return (c.h * Math.exp(-FOUR_LN2 * u * u)) / (significance * sigma);
    }
    if (c.c - box.lo < box.step || box.hi - c.c < box.step) return 0;
    if (c.w >= Math.min(MAX_FWHM / CM_PER_KK, box.span) * 0.999) return 0;
    const crowded = inside.some(
      (o) => o !== c && o.h >= c.h && Math.abs(o.c - c.c) < MERGE_FRACTION * Math.min(o.w, c.w),
    );
    if (crowded) return 0;
    return Math.min(c.h / (significance * sigma), c.h / (minRelative * tallestNear(c) || Infinity), tRatio);
  });
}

/**
 * Removes the weakest failing band and refits, until every band counts and there are at most
 * maxBands inside. An inside band that slid onto an end of the window is not removed but
 * turned into an edge band there (unless one exists): its maximum lies beyond the window.
 */
function prune(ctx: FitContext, start: FitState, criteria: Criteria): FitState {
  let state = start;
  for (;;) {
    const s = strengths(ctx, state, criteria);
    const insideCount = state.components.filter((c) => c.kind === 'inside').length;
    let worst = -1;
    s.forEach((v, j) => {
      const tooMany = insideCount > criteria.maxBands && state.components[j]?.kind === 'inside';
      if ((v < 1 || tooMany) && (worst < 0 || v < (s[worst] as number))) worst = j;
    });
    if (worst < 0) return state;
    // Bands far below the mark all go at once (they do not come back by refitting); otherwise
    // only the weakest, since removing it can make a neighbour count.
    const hopeless = s.flatMap((v, j) => (v < HOPELESS && state.components[j]?.kind === 'inside' ? [j] : []));
    const removed = new Set(hopeless.length > 1 ? hopeless : [worst]);
    const converted = new Set<ComponentKind>();
    const components = state.components.flatMap((c, j): Component[] => {
      if (!removed.has(j)) return [c];
      const edge = c.kind === 'inside' ? edgeKindAt(c, ctx.box) : undefined;
      if (!edge || converted.has(edge) || state.components.some((o) => o.kind === edge)) return [];
      converted.add(edge);
      const end = edge === 'blue-edge' ? ctx.box.hi : ctx.box.lo;
      return [{ kind: edge, c: end + (edge === 'blue-edge' ? 1 : -1) * ctx.box.step * 2, h: c.h, w: c.w }];
    });
    state = fitAll(ctx, { components, b: baselineOf(state, ctx.baselineKind) }, state);
  }
}

/** Which end of the window an inside band has slid onto, if any. */
function edgeKindAt(c: Component, box: Box): ComponentKind | undefined {
  if (box.hi - c.c < box.step) return 'blue-edge';
  if (c.c - box.lo < box.step) return 'red-edge';
  return undefined;
}

/**
 * Adds bands one at a time. Each round scores the remaining candidates by what the current
 * model leaves where they sit (the smoothed residual, or the height implied by a dip in its
 * curvature), fits the few best, and keeps the acceptable one that lowers χ² most; the other
 * acceptable ones are offered again next round, the rest are dropped.
 */
function addBands(
  ctx: FitContext,
  detect: { readonly x: Float64Array; readonly y: Float64Array },
  candidates: readonly Candidate[],
  criteria: Criteria,
  start: FitState,
): FitState {
  const { box } = ctx;
  const windowSize = sgWindow(box.minW, box, detect.x.length);
  const smooth = (v: Float64Array, derivative: number) =>
    sgg(v, box.step, { windowSize, polynomial: derivative === 0 ? 2 : 3, derivative });
  let state = start;
  const remaining = [...candidates];
  const insideCount = () => state.components.filter((c) => c.kind === 'inside').length;
  while (remaining.length > 0) {
    const model = evaluate(state, detect.x, ctx.xMid);
    const raw = detect.y.map((v, i) => v - (model[i] as number));
    const residual = smooth(raw, 0);
    const curvature = smooth(raw, 2);
    const scored = remaining
      .filter((cand) => cand.kind !== 'inside' || insideCount() < criteria.maxBands)
      .map((cand) => {
        const at = cand.kind === 'inside' ? cand.c : cand.kind === 'blue-edge' ? box.hi : box.lo;
        const i = indexAt(at, box, detect.x.length);
        const r = residual[i] ?? 0;
        const dd = curvature[i] ?? 0;
        // A shoulder hidden under a band fitted too broad leaves little residual but a dip in
        // its curvature; y″ = −8 ln 2 · h / w² turns that dip into the height it implies.
        const implied = cand.kind === 'inside' ? (-dd * cand.w * cand.w) / (2 * FOUR_LN2) : 0;
        return { cand, score: Math.max(r, implied), height: Math.max(r, criteria.sigma) };
      })
      .filter((c) => c.score >= criteria.significance * criteria.sigma)
      .sort((a, b) => b.score - a.score)
      .slice(0, TRIALS_PER_ROUND);
    if (scored.length === 0) break;
    let accepted: { trial: FitState; cand: Candidate } | undefined;
    for (const { cand, height } of scored) {
      remaining.splice(remaining.indexOf(cand), 1);
      // An edge band centred half a FWHM outside the window is at half height at the window's end.
      const h = cand.kind === 'inside' ? height : 2 * height;
      const trial = fitWith(ctx, state, { kind: cand.kind, c: cand.c, h, w: cand.w });
      if (!acceptable(ctx, trial, state, criteria)) continue;
      if (!accepted || trial.chi2 < accepted.trial.chi2) {
        if (accepted) remaining.push(accepted.cand);
        accepted = { trial, cand };
      } else remaining.push(cand);
    }
    if (accepted) state = accepted.trial;
  }
  return state;
}

/**
 * An addition is kept when χ² falls by more than significance² residual variances and every
 * band still counts.
 */
function acceptable(ctx: FitContext, trial: FitState, previous: FitState, criteria: Criteria): boolean {
  const P = parameterCount(trial.components.length, ctx.baselineKind);
  const s2 = trial.chi2 / Math.max(1, ctx.x.length - P);
  if (previous.chi2 - trial.chi2 <= criteria.significance ** 2 * s2) return false;
  return strengths(ctx, trial, criteria).every((v) => v >= 1);
}
