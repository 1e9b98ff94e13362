/**
 * Fractions of dissolved inorganic carbon as CO2*, HCO3- and CO3-- against pH, from the water's
 * own conditional K1 and K2 (the closed-system Bjerrum relations): with h = 10^-pH,
 * D = h² + K1·h + K1·K2, the fractions are h²/D, K1·h/D and K1·K2/D.
 */

export interface Fractions {
  co2: number;
  hco3: number;
  co3: number;
}

export function fractionsAt(ph: number, pk1: number, pk2: number): Fractions {
  // Work relative to K1 to stay finite at extreme pH: x = h/K1, y = K2/h.
  const x = 10 ** (pk1 - ph);
  const y = 10 ** (ph - pk2);
  const d = x + 1 + y;
  return { co2: x / d, hco3: 1 / d, co3: y / d };
}

export interface SpeciationStyle {
  text: string;
  grid: string;
  colours: [string, string, string];
  marker: string;
}

/** Draws the diagram on a canvas at device resolution; returns the pH range drawn. */
export function drawSpeciation(
  canvas: HTMLCanvasElement,
  pk1: number,
  pk2: number,
  samplePh: number | undefined,
  axisLabel: string,
  style: SpeciationStyle,
  /** What the sample line says (default "sample 7.91"); e.g. the meter's reading on its own scale. */
  markerLabel?: string,
): [number, number] {
  const dpr = globalThis.devicePixelRatio || 1;
  const cssW = canvas.clientWidth || 600;
  const cssH = canvas.clientHeight || 260;
  canvas.width = Math.round(cssW * dpr);
  canvas.height = Math.round(cssH * dpr);
  const g = canvas.getContext('2d');
  const lo = Math.floor(Math.min(pk1 - 2.5, samplePh ?? 99));
  const hi = Math.ceil(Math.max(pk2 + 2.5, samplePh ?? -99));
  if (!g) return [lo, hi];
  g.setTransform(dpr, 0, 0, dpr, 0, 0);
  g.clearRect(0, 0, cssW, cssH);
  const m = { l: 44, r: 12, t: 12, b: 40 };
  const w = cssW - m.l - m.r;
  const h = cssH - m.t - m.b;
  const X = (ph: number) => m.l + ((ph - lo) / (hi - lo)) * w;
  const Y = (f: number) => m.t + (1 - f) * h;

  g.font = '13px system-ui, sans-serif';
  g.lineWidth = 1;
  g.strokeStyle = style.grid;
  g.fillStyle = style.text;
  g.textAlign = 'center';
  for (let p = lo; p <= hi; p++) {
    g.beginPath();
    g.moveTo(X(p), m.t);
    g.lineTo(X(p), m.t + h);
    g.stroke();
    g.fillText(String(p), X(p), m.t + h + 16);
  }
  g.textAlign = 'right';
  for (let f = 0; f <= 1.0001; f += 0.25) {
    g.beginPath();
    g.moveTo(m.l, Y(f));
    g.lineTo(m.l + w, Y(f));
    g.stroke();
    g.fillText(f.toFixed(2), m.l - 6, Y(f) + 4);
  }
  g.textAlign = 'center';
  g.fillText(axisLabel, m.l + w / 2, cssH - 4);

  const keys: (keyof Fractions)[] = ['co2', 'hco3', 'co3'];
  const names = ['CO₂*', 'HCO₃⁻', 'CO₃²⁻'];
  keys.forEach((k, i) => {
    g.strokeStyle = style.colours[i]!;
    g.lineWidth = 2.5;
    g.setLineDash(i === 1 ? [] : i === 0 ? [6, 3] : [2, 3]);
    g.beginPath();
    for (let px = 0; px <= w; px++) {
      const ph = lo + (px / w) * (hi - lo);
      const f = fractionsAt(ph, pk1, pk2)[k];
      if (px === 0) g.moveTo(m.l + px, Y(f));
      else g.lineTo(m.l + px, Y(f));
    }
    g.stroke();
    g.setLineDash([]);
    // Label each curve where it dominates.
    const at = i === 0 ? pk1 - 1.6 : i === 1 ? (pk1 + pk2) / 2 : pk2 + 1.6;
    g.fillStyle = style.colours[i]!;
    g.font = 'bold 13px system-ui, sans-serif';
    g.fillText(names[i]!, X(at), Y(fractionsAt(at, pk1, pk2)[k]) - 8);
  });

  if (samplePh !== undefined && Number.isFinite(samplePh)) {
    g.strokeStyle = style.marker;
    g.lineWidth = 2;
    g.beginPath();
    g.moveTo(X(samplePh), m.t);
    g.lineTo(X(samplePh), m.t + h);
    g.stroke();
    g.fillStyle = style.marker;
    g.font = 'bold 13px system-ui, sans-serif';
    g.textAlign = X(samplePh) > m.l + w - 80 ? 'right' : 'left';
    g.fillText(
      markerLabel ?? `sample ${samplePh.toFixed(2)}`,
      X(samplePh) + (g.textAlign === 'right' ? -4 : 4),
      m.t + 12,
    );
  }
  return [lo, hi];
}
