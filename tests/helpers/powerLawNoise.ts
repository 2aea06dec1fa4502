/**
 * Seeded power-law noise for tests (our own generator). Phase x with spectrum S_x(f) ∝ f^(α−2),
 * i.e. fractional frequency S_y(f) ∝ f^α, by fractional differencing of white Gaussian noise
 * (N. J. Kasdin and T. Walter, "Discrete simulation of power law noise", 1992 IEEE FCS; Kasdin,
 * Proc. IEEE 83(5), 1995): filter h_0 = 1, h_k = h_{k−1}·(β/2 + k − 1)/k with β = 2 − α, applied
 * by direct convolution (O(N²); fine for the test sizes). Integer β uses plain cumulative sums.
 */

/** Deterministic uniform generator (mulberry32; common practice). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by Box–Muller from a seeded uniform generator. */
export function gaussian(rand: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = rand();
    const v = rand();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

/** Cumulative sum (one integration). */
export function cumsum(a: Float64Array): Float64Array {
  const out = new Float64Array(a.length);
  let s = 0;
  for (let i = 0; i < a.length; i++) {
    s += a[i];
    out[i] = s;
  }
  return out;
}

/** Flicker (β = 1) noise by the Kasdin–Walter filter. */
function flicker(w: Float64Array): Float64Array {
  const n = w.length;
  const h = new Float64Array(n);
  h[0] = 1;
  for (let k = 1; k < n; k++) h[k] = (h[k - 1] * (0.5 + k - 1)) / k;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let acc = 0;
    for (let k = 0; k <= i; k++) acc += h[k] * w[i - k];
    out[i] = acc;
  }
  return out;
}

/**
 * N phase values of power-law noise of type α (2 white PM, 1 flicker PM, 0 white FM,
 * −1 flicker FM, −2 random-walk FM), unit innovation, seeded.
 */
export function powerLawPhase(alpha: 2 | 1 | 0 | -1 | -2, n: number, seed: number): Float64Array {
  const g = gaussian(mulberry32(seed));
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) w[i] = g();
  switch (alpha) {
    case 2:
      return w;
    case 1:
      return flicker(w);
    case 0:
      return cumsum(w);
    case -1:
      return cumsum(flicker(w));
    case -2:
      return cumsum(cumsum(w));
  }
}
