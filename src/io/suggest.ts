/**
 * "Did you mean …?" for misspelt keys and option values. Edit distance is the optimal string
 * alignment form of Damerau–Levenshtein: insert, delete, substitute, or swap two neighbours, each 1.
 */

/**
 * Optimal-string-alignment distance between two strings (number of single-character edits,
 * a swap of two adjacent characters counting as one). Case-sensitive.
 */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rolling rows are enough: the swap looks back two rows.
  let prev2 = new Array<number>(m + 1).fill(0);
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, prev2[j - 2] + 1);
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[m];
}

/**
 * The candidate closest to `word`, or null when none is close enough to be a plausible typo.
 * Comparison ignores case (so `LatDeg` finds `latDeg`); ties go to the case-sensitive distance,
 * then to the earlier candidate. "Close enough": at most max(1, ⌊0.4 × longer length⌋) edits.
 */
export function nearest(word: string, candidates: readonly string[]): string | null {
  const w = word.toLowerCase();
  let best: string | null = null;
  let bestD = Infinity;
  let bestExact = Infinity;
  for (const c of candidates) {
    const d = editDistance(w, c.toLowerCase());
    const limit = Math.max(1, Math.floor(0.4 * Math.max(w.length, c.length)));
    if (d > limit) continue;
    const exact = editDistance(word, c);
    if (d < bestD || (d === bestD && exact < bestExact)) {
      best = c;
      bestD = d;
      bestExact = exact;
    }
  }
  return best;
}
