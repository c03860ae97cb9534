/**
 * The median of a scratch array by Hoare's selection, shared by the importer, the signal stage and
 * the bias-grid helpers.
 *
 * Reference: C. A. R. Hoare, "Algorithm 65: Find", Commun. ACM 4, 321–322 (1961).
 */

/**
 * Rearranges `a[lo..hi]` so that a[k] is the value a full sort would put there, everything left
 * of it ≤ a[k] and right of it ≥ a[k] (Hoare's selection, median-of-three pivot). Expected O(n).
 */
function select(a: Float64Array, k: number, lo = 0, hi = a.length - 1): number {
  while (hi > lo) {
    const mid = (lo + hi) >>> 1;
    // Median of three as pivot, moved to a[mid].
    if (a[mid] < a[lo]) swap(a, mid, lo);
    if (a[hi] < a[lo]) swap(a, hi, lo);
    if (a[hi] < a[mid]) swap(a, hi, mid);
    const pivot = a[mid];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/** Median of a scratch array that may be reordered; finite values assumed, length ≥ 1. */
export function medianInPlace(a: Float64Array): number {
  const n = a.length;
  const k = n >>> 1;
  const upper = select(a, k);
  if (n % 2 === 1) return upper;
  // Even length: the lower middle is the largest value left of k.
  let lower = -Infinity;
  for (let i = 0; i < k; i++) if (a[i] > lower) lower = a[i];
  return (lower + upper) / 2;
}
