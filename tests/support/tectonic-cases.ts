import { create, all } from 'mathjs';
import { expect } from 'vitest';
import type { BlockResult } from '@/lib/engine';
import cases from '../fixtures/reference-cases-tectonic.json';
import { isClose } from './approx';
import { runBlock } from './engine-sheets';

/**
 * The public reference cases P22–P37 (tests/fixtures/reference-cases-tectonic.json, copied from
 * the shared reference set with their sources), run through the engine in the cases' own units
 * and again with every input converted to SI base units (a second unit system).
 */
interface CaseValue {
  value: unknown;
  unit: string;
}
interface CaseExpectation {
  value: number | string;
  unit: string;
  rel_tol?: number;
  abs_tol?: number;
}
export interface TectonicCase {
  id: string;
  type: string;
  description: string;
  inputs: Record<string, CaseValue>;
  expected: Record<string, CaseExpectation>;
  expected_series?: Record<string, { points: number; xUnit: string; yUnit: string; x: Record<string, number>; y: Record<string, number>; rel_tol: number; abs_tol: number }>;
  expected_warnings: string[];
  source: string;
  note: string;
}

export function tectonicCase(id: string): TectonicCase {
  const found = (cases.cases as unknown as TectonicCase[]).find((c) => c.id === id);
  if (!found) throw new Error(`no reference case ${id}`);
  return found;
}

export function tectonicCaseIds(type: string): string[] {
  return (cases.cases as unknown as TectonicCase[]).filter((c) => c.type === type).map((c) => c.id);
}

// An independent mathjs instance (the npm package, not the engine's), used only to rewrite a
// case's inputs in SI base units.
const reference = create(all!, { number: 'number' });
reference.createUnit('yr', { definition: '365.25 day' });
reference.createUnit('kyr', { definition: '1000 yr', aliases: ['ka'] });
reference.createUnit('Myr', { definition: '1e6 yr', aliases: ['Ma'] });
reference.createUnit('atoms', { definition: '1' });

/** One input as the sheet would hold it: a quoted word, a plain number, or a value and unit. */
export function inputExpression(input: CaseValue, system: 'case' | 'si'): string {
  if (typeof input.value === 'string') return JSON.stringify(input.value);
  const value = input.value as number;
  if (input.unit === '' || input.unit === '1') return String(value);
  if (system === 'case') return input.unit.startsWith('1/') ? `${value} / ${input.unit.slice(2)}` : `${value} ${input.unit}`;
  const si = reference.unit(value, input.unit).toSI();
  const units = si.formatUnits();
  return units === '' ? String(si.toNumber()) : `${si.toNumber(units)} ${units}`;
}

export function caseInputs(c: TectonicCase, system: 'case' | 'si'): Record<string, string> {
  return Object.fromEntries(Object.entries(c.inputs).map(([name, input]) => [name, inputExpression(input, system)]));
}

/** Display units that show each output in the case's unit. */
export function caseDisplay(c: TectonicCase): Record<string, string> {
  const display: Record<string, string> = {};
  for (const [name, e] of Object.entries(c.expected)) if (e.unit !== '' && e.unit !== '1') display[name] = e.unit;
  return display;
}

export function runCase(c: TectonicCase, system: 'case' | 'si'): BlockResult {
  return runBlock(c.type, caseInputs(c, system), caseDisplay(c));
}

/** Checks every expected output, series point and warning of a case, with the case's tolerances. */
export function expectCase(c: TectonicCase, result: BlockResult): void {
  expect(result.status, `${c.id}: ${result.error}`).toBe('ok');
  for (const [name, e] of Object.entries(c.expected)) {
    const output = result.outputs[name];
    expect(output, `${c.id} ${name}`).toBeDefined();
    if (typeof e.value === 'string') {
      expect(output!.value, `${c.id} ${name}`).toBe(e.value);
      continue;
    }
    const got = output!.value as number;
    expect(isClose(got, e.value, e.rel_tol ?? 0, e.abs_tol ?? 0), `${c.id} ${name}: ${got} vs ${e.value} (rel ${e.rel_tol})`).toBe(true);
  }
  for (const [name, s] of Object.entries(c.expected_series ?? {})) {
    const series = result.series?.[name];
    expect(series, `${c.id} series ${name}`).toBeDefined();
    expect(series!.x).toHaveLength(s.points);
    expect(series!.xUnit).toBe(s.xUnit);
    expect(series!.yUnit).toBe(s.yUnit);
    for (const [index, x] of Object.entries(s.x)) {
      expect(isClose(series!.x[Number(index)]!, x, s.rel_tol, s.abs_tol), `${c.id} ${name}.x[${index}]`).toBe(true);
    }
    for (const [index, y] of Object.entries(s.y)) {
      const got = series!.y[Number(index)]!;
      expect(isClose(got, y, s.rel_tol, s.abs_tol), `${c.id} ${name}.y[${index}]: ${got} vs ${y}`).toBe(true);
    }
  }
  if (c.expected_warnings.length === 0) expect(result.warnings, c.id).toEqual([]);
  for (const text of c.expected_warnings) expect(result.warnings.some((w) => w.includes(text)), `${c.id} warning "${text}" in ${result.warnings.join(' | ')}`).toBe(true);
}

/**
 * The cases' values come from an independent computation and are stored to 12 significant digits;
 * the engine uses the same constants (g = 9.80665 m/s², R = 8.314462618 J/(mol K), the Julian year),
 * so it must also agree far inside the cases' tolerances, which are widened only to accept 9.81 or
 * a 365-day year. This checks every numeric output and series point at `relTol` (abs 1e-9 near 0).
 */
export function expectCaseTight(c: TectonicCase, result: BlockResult, relTol = 1e-9): void {
  expect(result.status, `${c.id}: ${result.error}`).toBe('ok');
  for (const [name, e] of Object.entries(c.expected)) {
    if (typeof e.value !== 'number') continue;
    const got = result.outputs[name]!.value as number;
    expect(isClose(got, e.value, relTol, 1e-9), `${c.id} ${name}: ${got} vs ${e.value} at ${relTol}`).toBe(true);
  }
  for (const [name, s] of Object.entries(c.expected_series ?? {})) {
    for (const [index, y] of Object.entries(s.y)) {
      const got = result.series![name]!.y[Number(index)]!;
      expect(isClose(got, y, relTol, 1e-9), `${c.id} ${name}.y[${index}]: ${got} vs ${y}`).toBe(true);
    }
  }
}

/** Runs one case in both unit systems with its own tolerances and the tight check. */
export function checkCaseBothSystems(id: string): void {
  const c = tectonicCase(id);
  for (const system of ['case', 'si'] as const) {
    const result = runCase(c, system);
    expectCase(c, result);
    expectCaseTight(c, result);
  }
}
