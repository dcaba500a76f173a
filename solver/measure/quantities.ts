/**
 * DC operating-point quantities for measures: node voltages, part currents and the per-device
 * figures of the bipolar and MOS models. Every lookup of an unknown name or a quantity the
 * device does not have throws a MeasureError with a suggestion, never returns undefined.
 */
import { GROUND } from '../circuit/types';
import type { BjtOp, DeviceOp, DiodeOp, MosOp, OpResult } from '../circuit/result';
import { MEASURABLE } from '../language/vocabulary';
import { MeasureError, didYouMean } from './measure-error';

/** Per-device quantities the language offers, by device family (the vocabulary's table). */
export const BJT_QUANTITIES = MEASURABLE.bjt;
export const MOS_QUANTITIES = MEASURABLE.mos;
/** A measurable device quantity's name (`ic`, `gm`, …). */
export type DeviceQuantity = string;
/** Every measurable device quantity once, bipolar first. */
export const DEVICE_QUANTITIES: DeviceQuantity[] = [...new Set([...BJT_QUANTITIES, ...MOS_QUANTITIES])];

function requireName(fn: string, name: unknown): string {
  if (typeof name !== 'string') {
    throw new MeasureError(`${fn}() takes a name, not a number or expression.`, `write ${fn}(name)`);
  }
  return name;
}

/** DC voltage of a node (gnd is 0 V). */
export function nodeVoltage(op: OpResult, node: unknown): number {
  const name = requireName('v', node);
  if (name === GROUND) return 0;
  const value = op.nodes[name];
  if (value === undefined) {
    throw new MeasureError(`v(${name}): there is no node \`${name}\`.`, didYouMean(name, Object.keys(op.nodes)));
  }
  return value;
}

/** DC current through a two-terminal part or source, in its own from→to / p→n sense. */
export function partCurrent(op: OpResult, part: unknown): number {
  const name = requireName('i', part);
  const passive = op.parts[name];
  if (passive) return passive.i;
  const source = op.sources[name];
  if (source) return source.i;
  if (op.devices[name]) {
    throw new MeasureError(`i(${name}): \`${name}\` is a ${op.devices[name].kind}; i() reads two-terminal parts and sources.`, 'use ic(), ib(), ie() or id() for a device');
  }
  const known = [...Object.keys(op.parts), ...Object.keys(op.sources)];
  throw new MeasureError(`i(${name}): there is no two-terminal part or source \`${name}\`.`, didYouMean(name, known));
}

/** One operating-point quantity of a device, e.g. ic of q1. */
export function deviceQuantity(op: OpResult, quantity: DeviceQuantity, device: unknown): number {
  const name = requireName(quantity, device);
  const d: DeviceOp | undefined = op.devices[name];
  if (!d) {
    const hint = didYouMean(name, Object.keys(op.devices));
    const what = op.parts[name] || op.sources[name] ? `\`${name}\` is not a transistor` : `there is no device \`${name}\``;
    throw new MeasureError(`${quantity}(${name}): ${what}.`, hint);
  }
  if (d.kind === 'npn' || d.kind === 'pnp') {
    if (BJT_QUANTITIES.includes(quantity)) return (d as BjtOp)[quantity as keyof BjtOp] as number;
    throw new MeasureError(`${quantity}(${name}): \`${name}\` is a bipolar transistor, which has no ${quantity}.`, `bipolar quantities: ${BJT_QUANTITIES.join(' ')}`);
  }
  if (d.kind === 'nmos' || d.kind === 'pmos') {
    if (MOS_QUANTITIES.includes(quantity)) return (d as MosOp)[quantity as keyof MosOp] as number;
    throw new MeasureError(`${quantity}(${name}): \`${name}\` is a MOS transistor, which has no ${quantity}.`, `MOS quantities: ${MOS_QUANTITIES.join(' ')}`);
  }
  // A diode offers its current as id; nothing else of the transistor lists applies.
  if (quantity === 'id') return (d as DiodeOp).id;
  throw new MeasureError(`${quantity}(${name}): \`${name}\` is a diode, which has no ${quantity}.`, 'a diode offers id(); use v(a, k) for its voltage');
}
