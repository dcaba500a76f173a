/**
 * Shared helpers of the netlist-level reference tests: solve a netlist (optionally with the
 * project's block library), insist that it solved, and the physical constants the formulas need.
 */
import { expect } from 'vitest';
import { solveNetlist } from '../../solver/index';
import type { SolveResult } from '../../solver/result';
import { createLibraryResolver, defaultLibraryDir } from '../../tools/library-resolver';

/** Boltzmann constant and elementary charge, exact by definition: BIPM, SI Brochure, 9th ed. (2019), Table 1. */
export const BOLTZMANN = 1.380649e-23;
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** Thermal voltage kT/q at a temperature in °C. */
export function thermalVoltage(tempC = 27): number {
  return (BOLTZMANN * (tempC + 273.15)) / ELEMENTARY_CHARGE;
}

const libraryLookup = createLibraryResolver(defaultLibraryDir());

/** Solves `text` with the seed library and fails the test on any error diagnostic. */
export function solveOk(text: string): SolveResult {
  const result = solveNetlist(text, { resolveUse: libraryLookup });
  expect(result.errors, JSON.stringify(result.errors, null, 1)).toEqual([]);
  return result;
}

/** A bipolar device's operating point from a result. */
export function bjt(result: SolveResult, name: string) {
  const d = result.op?.devices[name];
  if (!d || (d.kind !== 'npn' && d.kind !== 'pnp')) throw new Error(`${name} is not a bipolar device in the result`);
  return d;
}

/** A MOS device's operating point from a result. */
export function mos(result: SolveResult, name: string) {
  const d = result.op?.devices[name];
  if (!d || (d.kind !== 'nmos' && d.kind !== 'pmos')) throw new Error(`${name} is not a MOS device in the result`);
  return d;
}
