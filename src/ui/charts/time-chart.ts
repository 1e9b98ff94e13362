/**
 * Time-series chart over uPlot (loaded only when a chart is shown, to keep the shell small).
 * Full-resolution columns are kept; what uPlot draws is decimated to the pixels visible, and
 * re-decimated for the zoomed range, so 100 000 points stay smooth and zooming shows detail.
 */

import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { type Columnar, decimate } from './chart-data';
import { timeTicks } from './time-ticks';

/** Below this many readings each one is drawn as a dot as well as joined by the line. */
const SHOW_POINTS_BELOW = 300;

export interface SeriesSpec {
  label: string;
  /** Series sharing a unit share a y scale and axis. */
  unit: string;
}

export interface TimeChart {
  destroy(): void;
  /** Points currently handed to uPlot (after decimation). */
  drawnPoints(): number;
  plot: uPlot;
}

export const SERIES_COLOURS = ['#0b6e69', '#b4451f', '#3d55b8', '#7a5a00', '#8a2f7a', '#2f6b1f'];

function toAligned(c: Columnar): uPlot.AlignedData {
  return [c.xs, ...c.ys] as unknown as uPlot.AlignedData;
}

export function createTimeChart(
  el: HTMLElement,
  full: Columnar,
  specs: SeriesSpec[],
  opts: { height?: number; textColour?: string; gridColour?: string; locale?: string } = {},
): TimeChart {
  const height = opts.height ?? 280;
  const width = Math.max(200, el.clientWidth);
  const units = [...new Set(specs.map((s) => s.unit))];
  const axisStyle = {
    stroke: opts.textColour ?? '#1b1f23',
    grid: { stroke: opts.gridColour ?? '#d5d9dc', width: 1 },
  };
  // uPlot sets the x scale while it is being built; re-decimating then would re-enter setData.
  let busy = true;

  const initial = decimate(full, width);
  const plot = new uPlot(
    {
      width,
      height,
      scales: { x: { time: true } },
      cursor: { drag: { x: true, y: false } },
      legend: { live: true },
      series: [
        {
          value: (_u: uPlot, t: number | null) =>
            t == null
              ? ''
              : new Date(t * 1000).toLocaleString(opts.locale, { dateStyle: 'medium', timeStyle: 'short' }),
        },
        ...specs.map((s, i) => ({
          label: s.unit ? `${s.label} (${s.unit})` : s.label,
          scale: s.unit || 'none',
          stroke: SERIES_COLOURS[i % SERIES_COLOURS.length],
          width: 1.5,
          spanGaps: false,
          // Sparse field logs show each reading as a dot (a single reading has no line at all).
          points: { show: full.xs.length <= SHOW_POINTS_BELOW, size: 6 },
        })),
      ],
      axes: [
        {
          ...axisStyle,
          // Clock times with a date under them need about 70 px each: on a phone uPlot's default
          // spacing let the labels of one day run into each other.
          space: 72,
          values: (_u: uPlot, splits: number[], _axis: number, _space: number, incr: number) =>
            timeTicks(splits, incr, opts.locale),
        },
        ...units.slice(0, 2).map((u, i) => ({
          ...axisStyle,
          scale: u || 'none',
          side: i === 0 ? 3 : 1,
          label: u,
          grid: i === 0 ? axisStyle.grid : { show: false },
          size: 60,
        })),
      ],
      hooks: {
        // With no reading under the cursor uPlot writes "--" as each value; say nothing instead.
        setLegend: [
          (u: uPlot) => {
            u.root.querySelector('.u-legend')?.classList.toggle('idle', u.cursor.idx == null);
          },
        ],
        setScale: [
          (u: uPlot, key: string) => {
            if (key !== 'x' || busy) return;
            const min = u.scales.x?.min;
            const max = u.scales.x?.max;
            if (min === undefined || max === undefined) return;
            busy = true;
            u.setData(toAligned(decimate(full, u.bbox.width / devicePixelRatio || width, min, max)), false);
            busy = false;
          },
        ],
      },
    },
    toAligned(initial),
    el,
  );
  busy = false;
  // One reading (or all at one instant) has no span: show the day around it, not uPlot's default
  // padding of whole years.
  const x0 = full.xs[0];
  if (x0 !== undefined && x0 === full.xs[full.xs.length - 1])
    plot.setScale('x', { min: x0 - 43_200, max: x0 + 43_200 });

  // Figures for tests and benchmarks (and anyone inspecting the page): what is plotted.
  const describe = () => {
    el.dataset.totalPoints = String(full.xs.length);
    el.dataset.drawnPoints = String(plot.data[0]?.length ?? 0);
    el.dataset.xMin = String(full.xs[0] ?? '');
    el.dataset.xMax = String(full.xs[full.xs.length - 1] ?? '');
    el.dataset.scaleSpan = String((plot.scales.x?.max ?? 0) - (plot.scales.x?.min ?? 0));
  };
  describe();
  plot.hooks.setData = [...(plot.hooks.setData ?? []), describe];
  plot.hooks.setScale = [...(plot.hooks.setScale ?? []), describe];

  const stopPinch = pinchZoom(plot);

  const ro = new ResizeObserver(() => {
    const w = Math.max(200, el.clientWidth);
    if (w !== plot.width) plot.setSize({ width: w, height });
  });
  ro.observe(el);

  return {
    plot,
    drawnPoints: () => plot.data[0]?.length ?? 0,
    destroy() {
      stopPinch();
      ro.disconnect();
      plot.destroy();
    },
  };
}

/**
 * Two fingers on the plot zoom the time axis (uPlot has drag-to-zoom for a mouse only): the time
 * under the fingers' midpoint stays put while the span scales with the distance between them.
 * The existing setScale hook re-decimates the zoomed range.
 */
export function pinchZoom(plot: uPlot): () => void {
  const over = plot.over;
  let start: { mid: number; dist: number; min: number; max: number } | undefined;
  const xs = (e: TouchEvent) => {
    const r = over.getBoundingClientRect();
    return [e.touches[0]!.clientX - r.left, e.touches[1]!.clientX - r.left] as const;
  };
  const onStart = (e: TouchEvent) => {
    if (e.touches.length !== 2) return;
    const [a, b] = xs(e);
    const min = plot.scales.x?.min;
    const max = plot.scales.x?.max;
    if (min == null || max == null) return;
    start = { mid: plot.posToVal((a + b) / 2, 'x'), dist: Math.max(Math.abs(a - b), 10), min, max };
    e.preventDefault();
  };
  const onMove = (e: TouchEvent) => {
    if (!start || e.touches.length !== 2) return;
    e.preventDefault();
    const [a, b] = xs(e);
    const k = start.dist / Math.max(Math.abs(a - b), 10);
    plot.setScale('x', {
      min: start.mid - (start.mid - start.min) * k,
      max: start.mid + (start.max - start.mid) * k,
    });
  };
  const onEnd = () => {
    start = undefined;
  };
  over.addEventListener('touchstart', onStart, { passive: false });
  over.addEventListener('touchmove', onMove, { passive: false });
  over.addEventListener('touchend', onEnd);
  return () => {
    over.removeEventListener('touchstart', onStart);
    over.removeEventListener('touchmove', onMove);
    over.removeEventListener('touchend', onEnd);
  };
}
