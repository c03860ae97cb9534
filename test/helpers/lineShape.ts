/** FWHM of a sampled single peak by linear interpolation of the half-maximum crossings. */
export function fwhm(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let iMax = 0;
  for (let i = 1; i < y.length; i++) if (y[i] > y[iMax]) iMax = i;
  const half = y[iMax] / 2;
  let l = iMax, r = iMax;
  while (l > 0 && y[l] > half) l--;
  while (r < y.length - 1 && y[r] > half) r++;
  const xl = x[l] + ((half - y[l]) / (y[l + 1] - y[l])) * (x[l + 1] - x[l]);
  const xr = x[r - 1] + ((half - y[r - 1]) / (y[r] - y[r - 1])) * (x[r] - x[r - 1]);
  return xr - xl;
}
