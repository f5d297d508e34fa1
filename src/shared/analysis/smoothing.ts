/**
 * Savitzky–Golay smoothing. Coefficients are computed by least squares (not copied from a
 * table): fitting a polynomial of `order` to `window` equally spaced points and evaluating it at
 * one of them is a fixed linear combination of the points. At the ends the same fit is evaluated
 * off-centre, so no points are lost.
 */

/** Solves the small symmetric system M·X = I by Gauss–Jordan elimination (returns M⁻¹). */
function invert(m: number[][]): number[][] {
  const n = m.length;
  const a = m.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    const p = a[col][col];
    for (let c = 0; c < 2 * n; c++) a[col][c] /= p;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = a[r][col];
      if (f !== 0) for (let c = 0; c < 2 * n; c++) a[r][c] -= f * a[col][c];
    }
  }
  return a.map((row) => row.slice(n));
}

/**
 * Savitzky–Golay smoothing coefficients for a window of `window` points (odd) and polynomial
 * `order`, evaluated at offset `at` from the window centre (0 = centre, −m … m at the ends).
 */
export function savitzkyGolayCoefficients(window: number, order: number, at = 0): number[] {
  if (window % 2 !== 1 || window < 1) throw new RangeError('window must be a positive odd number');
  if (order >= window) throw new RangeError('order must be less than window');
  const m = (window - 1) / 2;
  const z = Array.from({ length: window }, (_, i) => i - m);
  // Normal matrix (AᵀA)[j][k] = Σ z^(j+k).
  const ata = Array.from({ length: order + 1 }, (_, j) =>
    Array.from({ length: order + 1 }, (_, k) => z.reduce((s, zi) => s + zi ** (j + k), 0)),
  );
  const inv = invert(ata);
  return z.map((zi) => {
    let c = 0;
    for (let j = 0; j <= order; j++) for (let k = 0; k <= order; k++) c += at ** j * inv[j][k] * zi ** k;
    return c;
  });
}

/**
 * Smooths equally spaced values with a Savitzky–Golay filter (quadratic by default). `window` is
 * made odd; windows of 1–2 points, or longer than the data, return a copy (shortened to fit).
 * NaN values pass through unsmoothed and are not used by their neighbours' fits.
 */
export function smoothSavitzkyGolay(values: number[], window: number, order = 2): number[] {
  let w = Math.floor(window);
  if (w % 2 === 0) w += 1;
  if (w > values.length) w = values.length % 2 === 1 ? values.length : values.length - 1;
  const ord = Math.min(order, w - 2);
  if (w < 3 || ord < 0) return [...values];
  if (values.some((v) => Number.isNaN(v))) return [...values];
  const m = (w - 1) / 2;
  const centre = savitzkyGolayCoefficients(w, ord, 0);
  const out = new Array<number>(values.length);
  const n = values.length;
  for (let i = 0; i < n; i++) {
    let coeffs = centre;
    let from = i - m;
    if (i < m) {
      from = 0;
      coeffs = savitzkyGolayCoefficients(w, ord, i - m);
    } else if (i > n - 1 - m) {
      from = n - w;
      coeffs = savitzkyGolayCoefficients(w, ord, i - (n - 1 - m));
    }
    let s = 0;
    for (let k = 0; k < w; k++) s += coeffs[k] * values[from + k];
    out[i] = s;
  }
  return out;
}
