/**
 * Columnar series for uPlot, built once from the log: x in seconds (ascending, unique), one
 * column per series with `null` for gaps (uPlot wants null, not NaN). With far more points than
 * pixels the data is decimated to the min and max of each pixel column, so the shape (spikes
 * included) survives while the chart stays fast.
 */

export type Column = (number | null)[];
export interface Columnar {
  xs: Float64Array;
  ys: Column[];
}

/** A series as (time in seconds, value) pairs, any order. */
export interface PointSeries {
  t: ArrayLike<number>;
  v: ArrayLike<number | null>;
}

/** Merges several series onto one ascending, unique x axis; a series missing at an x gets null. */
export function mergeSeries(series: PointSeries[]): Columnar {
  if (series.length === 1) {
    const s = series[0]!;
    // The log comes oldest first: when x is already strictly ascending, copy without sorting.
    let ascending = true;
    for (let i = 1; i < s.t.length && ascending; i++) ascending = s.t[i]! > s.t[i - 1]!;
    if (ascending) {
      const y: Column = new Array(s.t.length);
      for (let i = 0; i < s.t.length; i++) {
        const v = s.v[i];
        y[i] = v !== null && v !== undefined && Number.isFinite(v) ? v : null;
      }
      return { xs: Float64Array.from(s.t), ys: [y] };
    }
    const order = Array.from({ length: s.t.length }, (_, i) => i).sort((a, b) => s.t[a]! - s.t[b]!);
    const xs: number[] = [];
    const y: Column = [];
    for (const i of order) {
      const t = s.t[i]!;
      const v = s.v[i] ?? null;
      if (xs.length && xs[xs.length - 1] === t) {
        if (v !== null) y[y.length - 1] = v;
        continue;
      }
      xs.push(t);
      y.push(v !== null && Number.isFinite(v) ? v : null);
    }
    return { xs: Float64Array.from(xs), ys: [y] };
  }
  const all = new Set<number>();
  for (const s of series) for (let i = 0; i < s.t.length; i++) all.add(s.t[i]!);
  const xs = Float64Array.from(all).sort();
  const index = new Map<number, number>();
  for (let i = 0; i < xs.length; i++) index.set(xs[i]!, i);
  const ys = series.map((s) => {
    const col: Column = new Array(xs.length).fill(null);
    for (let i = 0; i < s.t.length; i++) {
      const v = s.v[i];
      if (v !== null && v !== undefined && Number.isFinite(v)) col[index.get(s.t[i]!)!] = v;
    }
    return col;
  });
  return { xs, ys };
}

function lowerBound(xs: Float64Array, x: number): number {
  let lo = 0;
  let hi = xs.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (xs[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Keeps, per bucket of x, the first, min, max and last point of each series (at most 4 per
 * bucket), within [xMin, xMax] plus one point either side so lines run to the edges.
 */
export function decimate(data: Columnar, buckets: number, xMin = -Infinity, xMax = Infinity): Columnar {
  const { xs, ys } = data;
  const start = Math.max(0, lowerBound(xs, xMin) - 1);
  let afterMax = lowerBound(xs, xMax);
  if (afterMax < xs.length && xs[afterMax] === xMax) afterMax++;
  const end = Math.min(xs.length, afterMax + 1);
  const n = end - start;
  if (n <= buckets * 4 || n < 2) {
    return { xs: xs.slice(start, end), ys: ys.map((y) => y.slice(start, end)) };
  }
  const x0 = xs[start]!;
  const span = xs[end - 1]! - x0 || 1;
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[n - 1] = 1;
  for (const y of ys) {
    let b = -1;
    let first = -1;
    let last = -1;
    let iMin = -1;
    let iMax = -1;
    const flush = () => {
      if (first >= 0) {
        keep[first] = 1;
        keep[last] = 1;
        keep[iMin] = 1;
        keep[iMax] = 1;
      }
    };
    for (let k = 0; k < n; k++) {
      const i = start + k;
      const v = y[i];
      const bucket = Math.min(buckets - 1, Math.floor(((xs[i]! - x0) / span) * buckets));
      if (bucket !== b) {
        flush();
        b = bucket;
        first = last = iMin = iMax = -1;
      }
      if (v === null || v === undefined) {
        // Keep gaps visible: a null next to data stays.
        if (last >= 0) keep[k] = 1;
        continue;
      }
      if (first < 0) {
        first = last = iMin = iMax = k;
        continue;
      }
      last = k;
      if (v < (y[start + iMin] as number)) iMin = k;
      if (v > (y[start + iMax] as number)) iMax = k;
    }
    flush();
  }
  let count = 0;
  for (let k = 0; k < n; k++) count += keep[k]!;
  const outX = new Float64Array(count);
  const outY: Column[] = ys.map(() => new Array(count));
  let j = 0;
  for (let k = 0; k < n; k++) {
    if (!keep[k]) continue;
    outX[j] = xs[start + k]!;
    for (let s = 0; s < ys.length; s++) outY[s]![j] = ys[s]![start + k] ?? null;
    j++;
  }
  return { xs: outX, ys: outY };
}
