import { spawnSync } from 'node:child_process';
import { Readable } from 'node:stream';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CliIo } from '../../src/cli/io';
import { runSolve } from '../../src/cli/solve';
import { runTitrate } from '../../src/cli/titrate';

/**
 * Hostile JSON lines for solve, titrate and plan (issue 15 §8–9). The invariants: the command
 * ends (within a bound), never throws, writes valid JSON only, one line per input line, every
 * error names its line, and no number in the output is anything but finite.
 */

async function inProcess(
  cmd: (a: string[], io: CliIo) => Promise<number>,
  stdin: string,
  args: string[] = [],
) {
  let out = '';
  const code = await cmd(args, {
    stdin: Readable.from([stdin]),
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: () => true },
  });
  return { code, lines: out === '' ? [] : out.replace(/\n$/, '').split('\n') };
}

const nasty = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.constantFrom(0, -0, 1e308, -1e308, 5e-324, 1e300, -1e-300, 2 ** 53, -1),
  fc.integer(),
  fc.string({ maxLength: 8 }),
  fc.boolean(),
  fc.constant(null),
  fc.jsonValue({ maxDepth: 2 }),
);
const near = (lo: number, hi: number) => fc.oneof(fc.double({ min: lo, max: hi, noNaN: true }), nasty);
const deep = fc.integer({ min: 30, max: 20_000 }).map((n) => `${'['.repeat(n)}${']'.repeat(n)}`);
const deepObject = fc.integer({ min: 30, max: 5_000 }).map((n) => `${'{"a":'.repeat(n)}1${'}'.repeat(n)}`);
const garbage = fc.string({ maxLength: 40 }).map((s) => `#${s.replace(/\n/g, ' ')}`);

const solveRequest = fc.record(
  {
    temperature_c: near(-5, 40),
    salinity: near(0, 40),
    alkalinity_umol_kg: near(500, 4000),
    dic_umol_kg: near(500, 4000),
    ph: near(6, 9),
    pco2_uatm: near(100, 2000),
    model: fc.constantFrom('saline', 'fresh', 'auto', 'brine'),
    specific_conductance_us_cm: near(10, 5000),
    calcium_mg_l: near(1, 200),
    uncertainty: fc.dictionary(
      fc.constantFrom('alkalinity_umol_kg', 'dic_umol_kg', 'ph', 'constants'),
      nasty,
      {
        maxKeys: 3,
      },
    ),
  },
  { requiredKeys: ['temperature_c'] },
);
const solveLine = fc.oneof(
  { weight: 6, arbitrary: solveRequest.map((r) => JSON.stringify(r)) },
  { weight: 1, arbitrary: deep },
  { weight: 1, arbitrary: deepObject },
  { weight: 1, arbitrary: garbage },
  {
    weight: 1,
    arbitrary: fc.constantFrom('', '   ', '\r', 'a\rb', '{"x":1}\r', 'null', '[]', '"x"', '1e999'),
  },
);

function checkLines(input: string[], output: string[]) {
  expect(output).toHaveLength(input.length);
  output.forEach((text, i) => {
    const v = JSON.parse(text) as Record<string, { line?: number; code?: string }>;
    if (v.error) {
      expect(v.error.line).toBe(i + 1);
      expect(typeof v.error.code).toBe('string');
    }
    if (v.skipped) expect(v.skipped).toMatchObject({ code: 'blank-line', line: i + 1 });
    // JSON writes a non-finite number as null; the contract leaves such numbers out instead.
    expect(text).not.toMatch(
      /"(standard_uncertainty|ph_total|pco2_uatm|dic_umol_kg|alkalinity_umol_kg)":null/,
    );
  });
}

describe('the batch contract, case by case (issue 15 §8–9)', () => {
  const ok = '{"temperature_c":25,"salinity":35,"alkalinity_umol_kg":2300,"dic_umol_kg":2000}';
  it('BOM, lone CR, blank line, deep nesting: one line out per line in, each error with its line', async () => {
    const input = [
      `\uFEFF${ok}`,
      `{"temperature_c":25,\r"salinity":35}`,
      '',
      `${'['.repeat(100_000)}${']'.repeat(100_000)}`,
      `${ok}\r`,
    ];
    const r = await inProcess(runSolve, `${input.join('\n')}\n`);
    const out = r.lines.map((l) => JSON.parse(l));
    expect(out).toHaveLength(5);
    expect(out[0].ph_total).toBeCloseTo(8.0401, 3);
    expect(out[1].error).toMatchObject({ code: 'too-few-parameters', line: 2 });
    expect(out[2].skipped).toMatchObject({ code: 'blank-line', line: 3 });
    expect(out[3].error).toMatchObject({ code: 'input-too-deep', line: 4 });
    expect(out[4].ph_total).toBe(out[0].ph_total);
    expect(r.code).toBe(1);
  });
  it('a number that overflows is left out and named, never null', async () => {
    const { keepFinite } = await import('../../src/cli/json-lines');
    const res = keepFinite({
      a: 1,
      b: Number.POSITIVE_INFINITY,
      c: { d: Number.NaN, e: [1, -Infinity] },
      warnings: [],
    });
    expect(res).toMatchObject({ a: 1, c: { e: [1, null] } });
    expect('b' in res).toBe(false);
    expect((res.warnings as { code: string; field: string }[]).map((w) => [w.code, w.field]).sort()).toEqual([
      ['value-not-finite', 'b'],
      ['value-not-finite', 'c.d'],
      ['value-not-finite', 'c.e[1]'],
    ]);
    const u = await inProcess(
      runSolve,
      `${ok.replace('}', ',"uncertainty":{"alkalinity_umol_kg":1e300,"dic_umol_kg":1e300}}')}\n`,
    );
    expect(u.lines[0]).not.toMatch(/null/);
  });
});

describe('hostile JSON lines', { timeout: 120_000 }, () => {
  it('solve: one valid JSON line per input line, errors with their line, numbers finite', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(solveLine, { minLength: 1, maxLength: 25 }),
        fc.boolean(),
        async (lines, bom) => {
          const r = await inProcess(runSolve, `${bom ? '\uFEFF' : ''}${lines.join('\n')}\n`);
          expect([0, 1]).toContain(r.code);
          checkLines(lines, r.lines);
        },
      ),
      { numRuns: 150 },
    );
  });

  const point = fc.record({ volume_ml: near(0, 50), ph: near(3, 9) }, { requiredKeys: [] });
  const titration = fc.record(
    {
      sample_volume_ml: near(10, 200),
      titrant_normality: near(0.001, 0.2),
      temperature_c: near(0, 40),
      points: fc.oneof(fc.array(point, { maxLength: 25 }), nasty),
      method: fc.constantFrom('gran', 'inflection', 'endpoint', 'two_endpoint', 'curve_fit', 'guess'),
      endpoint_ph: near(3, 6),
      uncertainty: fc.dictionary(fc.constantFrom('titrant_normality', 'ph', 'volume_ml'), nasty, {
        maxKeys: 2,
      }),
    },
    { requiredKeys: [] },
  );
  it('titrate: JSON Lines in, one valid JSON line out per line', async () => {
    const line = fc.oneof(
      { weight: 6, arbitrary: titration.map((t) => JSON.stringify(t)) },
      { weight: 1, arbitrary: deep },
      { weight: 1, arbitrary: garbage },
      { weight: 1, arbitrary: fc.constantFrom('', 'a\rb', '[]', '{}') },
    );
    await fc.assert(
      fc.asyncProperty(fc.array(line, { minLength: 2, maxLength: 12 }), async (lines) => {
        // A garbage line keeps the lines from forming one document, so JSON Lines apply.
        const all = [...lines, '#end'];
        const r = await inProcess(runTitrate, `${all.join('\n')}\n`);
        expect([0, 1]).toContain(r.code);
        checkLines(all, r.lines);
      }),
      { numRuns: 60 },
    );
  });

  it('plan: one hostile plan, one valid JSON line, within a bound, through the real command', () => {
    const water = fc.record(
      {
        temperature_c: near(0, 35),
        salinity: near(0, 40),
        alkalinity_umol_kg: near(500, 4000),
        ph: near(6, 9),
      },
      { requiredKeys: [] },
    );
    // "reach" (the inverse search) joins this list once its searches are bounded (src/chem/plan/inverse.ts).
    const action = fc.oneof(
      fc.record({
        action: fc.constant('add'),
        chemical: fc.constantFrom('sodium_bicarbonate', 'calcium_chloride', 'co2', 'lye'),
        moles: nasty,
        mass_g: near(0, 100),
      }),
      fc.record({
        action: fc.constant('equilibrate'),
        target_pco2_uatm: near(100, 2000),
        fraction: near(0, 1),
      }),
      fc.record({
        action: fc.constant('mix'),
        waters: fc.array(fc.record({ water, volume_l: near(1, 100) }), { maxLength: 2 }),
      }),
      nasty,
    );
    const request = fc.oneof(
      {
        weight: 6,
        arbitrary: fc
          .record({ water, volume_l: near(1, 1000), actions: fc.array(action, { maxLength: 3 }) })
          .map((p) => JSON.stringify(p)),
      },
      { weight: 1, arbitrary: deepObject },
      { weight: 1, arbitrary: garbage },
    );
    fc.assert(
      fc.property(request, (text) => {
        const r = spawnSync(process.execPath, ['bin/tufa.mjs', 'plan'], {
          input: text,
          encoding: 'utf8',
          timeout: 30_000,
        });
        expect(r.signal, 'the plan ran past 30 s').toBeNull();
        expect([0, 1]).toContain(r.status);
        const lines = r.stdout.replace(/\n$/, '').split('\n');
        expect(lines).toHaveLength(1);
        JSON.parse(lines[0]!);
        expect(r.stderr).not.toMatch(/internal-error|at .*\.mjs:\d+/);
      }),
      { numRuns: 12 },
    );
  });
});
