/** Min–max decimation of long series so that peaks survive in a figure of bounded size. */

/**
 * Keep at most about `maxPoints` points of an x-ordered series: split it into buckets by index and keep
 * each bucket's minimum and maximum y (in x order), plus the first and last points, so peaks survive.
 */
export function decimateMinMax(x: ArrayLike<number>, y: ArrayLike<number>, maxPoints: number): { x: number[]; y: number[] } {
  const len = x.length;
  if (len <= maxPoints) return { x: Array.from(x), y: Array.from(y) };
  const buckets = Math.max(1, Math.floor((maxPoints - 2) / 2));
  const ox: number[] = [x[0]];
  const oy: number[] = [y[0]];
  for (let b = 0; b < buckets; b++) {
    const i0 = 1 + Math.floor((b * (len - 2)) / buckets);
    const i1 = 1 + Math.floor(((b + 1) * (len - 2)) / buckets);
    if (i1 <= i0) continue;
    let iMin = i0;
    let iMax = i0;
    for (let i = i0 + 1; i < i1; i++) {
      if (y[i] < y[iMin]) iMin = i;
      if (y[i] > y[iMax]) iMax = i;
    }
    const [a, c] = iMin <= iMax ? [iMin, iMax] : [iMax, iMin];
    ox.push(x[a]);
    oy.push(y[a]);
    if (c !== a) {
      ox.push(x[c]);
      oy.push(y[c]);
    }
  }
  ox.push(x[len - 1]);
  oy.push(y[len - 1]);
  return { x: ox, y: oy };
}
