import { describe, expect, it } from 'vitest';
import {
  checkHistory,
  checkPlausible,
  QUANTITIES,
  siteProfile,
  tradeOfKind,
  tradeQuantities,
  tradeUnits,
} from '../../src/quantities';
import { readingRequest } from '../../src/reading/request';
import { SITE_KINDS } from '../../src/store/schema';

const fmt = (x: number) => String(x);
const spring = siteProfile({ kind: 'spring', defaults: {} });
const reef = siteProfile({ kind: 'reef', defaults: {} });
const pond = siteProfile({ kind: 'pond', defaults: {} });

describe('a site kind sets the trade and its defaults', () => {
  it('gives every kind a trade, and the user can choose another', () => {
    expect(SITE_KINDS.map((k) => [k, tradeOfKind(k)])).toEqual([
      ['stream', 'field'],
      ['spring', 'field'],
      ['well', 'field'],
      ['lake', 'field'],
      ['pond', 'aquaculture'],
      ['tank', 'aquarium'],
      ['other', 'field'],
      ['reef', 'aquarium'],
      ['raceway', 'aquaculture'],
      ['recirculating', 'aquaculture'],
    ]);
    expect(siteProfile({ kind: 'lake', defaults: { trade: 'aquaculture' } }).trade).toBe('aquaculture');
  });
  it('enters each trade in its own units, with every default unit in the table', () => {
    expect(tradeUnits(spring).alkalinity).toBe('meq_l');
    expect(tradeUnits(reef).alkalinity).toBe('dkh');
    expect(tradeUnits(reef).salinity).toBe('sg');
    expect(tradeUnits(pond).alkalinity).toBe('mg_l_caco3');
    for (const p of [spring, reef, pond]) {
      for (const [q, unit] of Object.entries(tradeUnits(p)))
        expect(QUANTITIES.find((d) => d.id === q)?.units.some((x) => x.id === unit)).toBe(true);
      for (const q of tradeQuantities(p)) expect(QUANTITIES.some((d) => d.id === q)).toBe(true);
    }
    expect(tradeQuantities(reef)).toContain('salinity');
    expect(tradeQuantities(spring)).toContain('conductance');
    expect(tradeQuantities(pond)).toContain('ammonia');
  });
});

describe('entry that catches the usual slips', () => {
  it('offers meq/L for alkalinity typed as 4.6 µmol/kg at a spring', () => {
    const n = checkPlausible(spring, 'alkalinity', 'umol_kg', 4.6, fmt)!;
    expect(n.fixUnit).toBe('meq_l');
    expect(n.message).toBe('4.6 µmol/kg is very low for a spring: did you mean meq/L?');
    expect(checkPlausible(spring, 'alkalinity', 'meq_l', 4.6, fmt)).toBeUndefined();
  });
  it('offers specific gravity for 1.025 typed as practical salinity in a reef tank', () => {
    expect(checkPlausible(reef, 'salinity', 'pss', 1.025, fmt)?.fixUnit).toBe('sg');
    expect(checkPlausible(reef, 'salinity', 'sg', 1.025, fmt)).toBeUndefined();
  });
  it('offers °F for 77 typed as °C in a tank, and just warns when no unit fits', () => {
    expect(checkPlausible(reef, 'temperature', 'c', 77, fmt)?.fixUnit).toBe('f');
    const ph = checkPlausible(pond, 'ph', 'ph', 11.5, fmt)!;
    expect(ph.fixUnit).toBeUndefined();
    expect(ph.message).toContain('pH 11.5 is very high for a pond (usually 5.5–10)');
  });
  it('compares with the site’s own readings once it has five', () => {
    const past = Array.from({ length: 40 }, (_, i) => ({ unit: 'ph', value: 7.1 + (i % 3) * 0.1 }));
    expect(checkHistory(spring, 'ph', 'ph', 6.1, past, (x) => x.toFixed(1))?.message).toBe(
      'pH 6.1: this spring has read 7.1–7.3 in 40 readings; check the meter.',
    );
    expect(checkHistory(spring, 'ph', 'ph', 7.4, past, fmt)).toBeUndefined();
    expect(checkHistory(spring, 'ph', 'ph', 6.1, past.slice(0, 4), fmt)).toBeUndefined();
    // Readings in another unit are compared in the quantity's reference unit (meq/L here).
    const alk = Array.from({ length: 6 }, () => ({ unit: 'mg_l_caco3', value: 230 }));
    expect(checkHistory(spring, 'alkalinity', 'meq_l', 4.6, alk, fmt)).toBeUndefined();
    expect(checkHistory(spring, 'alkalinity', 'meq_l', 2, alk, fmt)?.code).toBe('input-unlike-site-history');
  });
  it('turns specific gravity and TAN into the engine’s keys', () => {
    const { input } = readingRequest(
      {
        values: [
          { quantity: 'salinity', value: 1.0264, unit: 'sg' },
          { quantity: 'ammonia', value: 1.40067, unit: 'mg_l_n' },
          { quantity: 'calcium', value: 100.087, unit: 'mg_l_caco3' },
        ],
      },
      undefined,
    );
    // SG 1.0264 (25/25 °C) is about S 35 by EOS-80 (UNESCO 1981 tables, from memory: 35 ± 0.3).
    expect(input.salinity as number).toBeGreaterThan(34.5);
    expect(input.salinity as number).toBeLessThan(35.6);
    expect(input.ammonia_umol_kg as number).toBeCloseTo(100, 9);
    expect(input.calcium_mg_l as number).toBeCloseTo(40.078, 9);
  });
});
