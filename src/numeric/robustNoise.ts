/**
 * The standard deviation of Gaussian noise estimated robustly from the median absolute deviation:
 * σ = MAD / Φ⁻¹(3/4), with Φ⁻¹(3/4) = 0.6744897501960817 (Hampel, "The influence curve and its
 * role in robust estimation", J. Am. Stat. Assoc., 1974; from memory). The median of an even
 * count is the lower middle value.
 *
 * Written here although ml-spectra-processing (xNoiseStandardDeviation) computes the same, because
 * importing that package costs about 0.2 s at every start of the spectrum command.
 */

/** Φ⁻¹(3/4): the MAD of a unit normal distribution. */
const MAD_OF_UNIT_NORMAL = 0.6744897501960817;

/** The lower median of `values` (not empty). */
function lowerMedian(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  return sorted[Math.floor((sorted.length - 1) / 2)] as number;
}

/** The noise standard deviation of `values` (not empty) from their median absolute deviation. */
export function robustNoiseDeviation(values: ArrayLike<number>): number {
  const median = lowerMedian(values);
  const deviations = Float64Array.from(values, (v) => Math.abs(v - median));
  return lowerMedian(deviations) / MAD_OF_UNIT_NORMAL;
}
