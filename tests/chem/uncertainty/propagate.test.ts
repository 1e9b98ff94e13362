import { describe, expect, it } from 'vitest';
import type { TufaError } from '../../../src/chem/errors';
import { type Evaluate, propagateUncertainty } from '../../../src/chem/uncertainty/propagate';
import { uncertainInputs } from '../../../src/chem/uncertainty/solveUncertainty';

describe('first-order propagation', () => {
  // y = 3·a + b², z = a·b at a = 2, b = 5: ∂y/∂a = 3, ∂y/∂b = 10, ∂z/∂a = 5, ∂z/∂b = 2.
  const evaluate: Evaluate = (p) => {
    const a = 2 + (p?.name === 'a' ? p.delta : 0);
    const b = 5 + (p?.name === 'b' ? p.delta : 0);
    return { y: 3 * a + b * b, z: a * b };
  };
  it('matches the analytic law of propagation', () => {
    const r = propagateUncertainty(evaluate, [
      { name: 'a', u: 0.1 },
      { name: 'b', u: 0.02 },
    ]);
    expect(r.y!.contributions.a).toBeCloseTo(0.3, 6);
    expect(r.y!.contributions.b).toBeCloseTo(0.2, 4);
    expect(r.y!.standard_uncertainty).toBeCloseTo(Math.hypot(0.3, 0.2), 4);
    expect(r.y!.dominant_input).toBe('a');
    expect(r.z!.standard_uncertainty).toBeCloseTo(Math.hypot(0.5, 0.04), 6);
  });
  it('adds independent components in quadrature under one name', () => {
    // Four readings each entering a mean: u(mean) = u/√4.
    const mean: Evaluate = (p) => {
      const xs = [1, 2, 3, 4].map((x, i) => x + (p !== null && p.index === i ? p.delta : 0));
      return { mean: xs.reduce((s, x) => s + x, 0) / 4 };
    };
    const r = propagateUncertainty(mean, [{ name: 'reading', u: 0.2, components: 4 }]);
    expect(r.mean!.standard_uncertainty).toBeCloseTo(0.1, 10);
  });
  it('steps backwards at the edge of a domain', () => {
    const edge: Evaluate = (p) => {
      const x = 1 + (p?.delta ?? 0);
      if (x > 1) throw new Error('outside');
      return { y: 2 * x };
    };
    expect(propagateUncertainty(edge, [{ name: 'x', u: 0.1 }]).y!.standard_uncertainty).toBeCloseTo(0.2, 10);
  });
});

describe('reading an uncertainty request', () => {
  const input = { temperature_c: 20, salinity: 35, alkalinity_umol_kg: 2300, ph: 8.0, model: 'saline' };
  const code = (spec: unknown) => {
    try {
      uncertainInputs(input, spec);
      return 'none';
    } catch (e) {
      return (e as TufaError).code;
    }
  };
  it('lists inputs and, on request, the constants of Orr et al. 2018', () => {
    const list = uncertainInputs(input, { ph: 0.01, alkalinity_umol_kg: 2, constants: true, pk1: 0.01 });
    expect(list.map((x) => x.name)).toEqual([
      'ph',
      'alkalinity_umol_kg',
      'pk0',
      'pk1',
      'pk2',
      'pkb',
      'pkw',
      'pksp_calcite',
      'pksp_aragonite',
      'total_boron',
    ]);
    expect(list.find((x) => x.name === 'pk1')!.u).toBe(0.01);
    expect(list.find((x) => x.name === 'pk2')!.u).toBe(0.015);
  });
  it.each([
    ['not an object', 3, 'uncertainty-invalid'],
    ['negative', { ph: -0.1 }, 'uncertainty-invalid'],
    ['text', { ph: 'a little' }, 'uncertainty-invalid'],
    ['constants not boolean', { constants: 'yes' }, 'uncertainty-invalid'],
    ['input not given', { dic_umol_kg: 3 }, 'uncertainty-input-missing'],
    ['input not numeric', { model: 1 }, 'uncertainty-input-not-numeric'],
  ])('%s → %s', (_n, spec, expected) => {
    expect(code(spec)).toBe(expected);
  });
});
