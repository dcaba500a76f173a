/**
 * The measure functions over an `analyze poles` result (names of the vocabulary):
 *
 *   pole(k)   |s|/2π in Hz of the k-th pole from the slowest (k = 1: the dominant pole)
 *   zero(k)   |s|/2π in Hz of the k-th zero from the slowest
 *
 * A conjugate pair counts once (it is one natural frequency), so pole(2) of a stage with a
 * dominant real pole and a complex pair is the pair's |s|/2π. Magnitudes, positive whatever the
 * half-plane: the signs are in the `poles` member.
 */
import type { PoleZero } from '../circuit/result';
import { cx, isEffectivelyReal } from '../numeric/complex';
import { FollowOnError, MeasureError } from './measure-error';

/** What the poles analysis offers the measures: its lists, sorted by |s|, a pair with im > 0 first. */
export interface PolesMeasureData {
  poles: readonly PoleZero[];
  zeros: readonly PoleZero[];
}

type Fn = (...args: unknown[]) => unknown;

/** The k-th entry counting a conjugate pair once, as |s|/2π. */
function nth(fn: 'pole' | 'zero', list: readonly PoleZero[], args: unknown[]): number {
  if (args.length !== 1) throw new MeasureError(`${fn}() takes one index: ${fn}(1) is the slowest.`, `write ${fn}(1)`);
  const x = args[0];
  const z = typeof x === 'number' ? cx(x) : typeof x === 'object' && x !== null && 're' in x && 'im' in x ? (x as { re: number; im: number }) : undefined;
  const k = z && isEffectivelyReal(z) ? z.re : NaN;
  if (!Number.isInteger(k) || k < 1) throw new MeasureError(`${fn}() takes a whole number from 1: ${fn}(1) is the slowest.`, `write ${fn}(1)`);
  const distinct = list.filter((p) => p.im >= 0);
  if (k > distinct.length) {
    const what = fn === 'pole' ? 'pole' : 'zero';
    throw new MeasureError(
      distinct.length === 0 ? `${fn}(${k}): there is no finite ${what}.` : `${fn}(${k}): there ${distinct.length === 1 ? `is only 1 ${what}` : `are only ${distinct.length} ${what}s`} (a conjugate pair counts once).`,
      fn === 'zero' && distinct.length === 0 ? 'zeros need `ports`, or `analyze poles out NODE` with a source that has an `ac=`' : undefined,
    );
  }
  return Math.hypot(distinct[k - 1].re, distinct[k - 1].im);
}

/** pole() and zero() bound to one run's poles (absent: they say what is missing). */
export function poleFunctions(read: () => { poles?: PolesMeasureData; failed?: ReadonlySet<string> }): Record<string, Fn> {
  const need = (fn: string): PolesMeasureData => {
    const { poles, failed } = read();
    if (!poles && failed?.has('poles')) throw new FollowOnError('analyze poles');
    if (!poles) throw new MeasureError(`${fn}() needs the poles analysis.`, 'add `analyze poles`');
    return poles;
  };
  return {
    pole: (...args) => nth('pole', need('pole').poles, args),
    zero: (...args) => nth('zero', need('zero').zeros, args),
  };
}
