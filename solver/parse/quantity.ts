/**
 * Quantities: a number with an optional SI prefix and an optional unit (§1), e.g. `4.7k`,
 * `4.7 kΩ`, `10 pF`, `-10 V`, `1e-16`, `5%`. Prefixes are case-sensitive (`m` milli, `M` mega);
 * `meg` is refused with a hint, because a reviewer should read one spelling only.
 */
import { PREFIXES, UNITS } from './tokens';

import type { DiagnosticCode } from '../circuit/diagnostic';
import type { QuantityUnit } from '../language/vocabulary';

export type { QuantityUnit };

export type QuantityResult =
  | { ok: true; value: number; unit: string }
  | {
      ok: false;
      /** Diagnostic code: `bad-quantity`, `bad-unit`, `meg-prefix` or `unit-mismatch`. */
      code: Extract<DiagnosticCode, 'bad-quantity' | 'bad-unit' | 'meg-prefix' | 'unit-mismatch'>;
      message: string;
      hint?: string;
      /** Offset in `text` where the problem starts, and its length. */
      offset: number;
      length: number;
    };

const NUMBER = /^([+-]?)((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)( ?)(.*)$/s;
const UNIT_LIST = 'V A Ω ohm F H Hz s %';
const PREFIX_LIST = 'f p n u µ m k M G T';

/** What a slot's expected unit is called in a message. */
function unitName(unit: QuantityUnit): string {
  return unit === '' ? 'a plain number' : unit === '%' ? 'a fraction or %' : unit;
}

/** Hint for a suffix that is neither prefix nor unit: the closest thing the writer may have meant. */
function suffixHint(suffix: string): string {
  if (/^[fpnuµμmkMGT]?m$/.test(suffix) && suffix.length === 2)
    return `lengths take no unit: write 1${suffix[0]} for 1 ${suffix[0] === 'u' ? 'µ' : suffix[0]}m`;
  if (suffix === 'K') return 'prefixes are case-sensitive: write k for kilo';
  if (/^ohms?$/i.test(suffix) || /^[fpnuµμmkMGT]ohms$/.test(suffix)) return 'write ohm or Ω';
  for (const unit of Object.keys(UNITS)) {
    if (unit.toLowerCase() === suffix.toLowerCase() && unit !== suffix)
      return `units are case-sensitive: write ${unit}`;
  }
  const rest = suffix.slice(1);
  for (const unit of Object.keys(UNITS)) {
    if (PREFIXES[suffix[0]] !== undefined && unit.toLowerCase() === rest.toLowerCase() && unit !== rest)
      return `units are case-sensitive: write ${suffix[0]}${unit}`;
  }
  return `prefixes are ${PREFIX_LIST}; units are ${UNIT_LIST}`;
}

/**
 * Parses one quantity. `expectedUnit` (when given) is the unit of the slot; `slot` names the slot
 * in messages ("the resistance of `rc1`"). Never throws.
 */
export function parseQuantity(text: string, expectedUnit?: QuantityUnit, slot = 'this value'): QuantityResult {
  const lead = text.length - text.trimStart().length;
  const body = text.trim();
  const m = NUMBER.exec(body);
  if (!m) {
    return { ok: false, code: 'bad-quantity', message: `\`${body}\` is not a number.`, offset: lead, length: Math.max(1, body.length) };
  }
  const [, sign, literal, , suffix] = m;
  const suffixOffset = lead + body.length - suffix.length;
  let scale = 1;
  let unit = '';
  if (/^meg/i.test(suffix)) {
    return { ok: false, code: 'meg-prefix', message: `\`${suffix.slice(0, 3)}\` is not a prefix.`, hint: 'write M for mega', offset: suffixOffset, length: 3 };
  }
  if (suffix === '') {
    // plain number
  } else if (UNITS[suffix] !== undefined) {
    unit = UNITS[suffix];
  } else if (PREFIXES[suffix[0]] !== undefined && (suffix.length === 1 || (UNITS[suffix.slice(1)] !== undefined && suffix.slice(1) !== '%'))) {
    scale = PREFIXES[suffix[0]];
    unit = suffix.length > 1 ? UNITS[suffix.slice(1)] : '';
  } else {
    return { ok: false, code: 'bad-unit', message: `\`${suffix}\` is neither an SI prefix nor a unit.`, hint: suffixHint(suffix), offset: suffixOffset, length: suffix.length };
  }
  // Scale in decimal (`10u` → 10e-6), not by a binary multiply, so `10u` is exactly 1e-5.
  const exponent = Math.round(Math.log10(scale)) + (unit === '%' ? -2 : 0);
  let value = /[eE]/.test(literal) ? Number(literal) * 10 ** exponent : Number(`${literal}e${exponent}`);
  if (sign === '-') value = -value;
  if (!Number.isFinite(value)) {
    return { ok: false, code: 'bad-quantity', message: `\`${body}\` is too large to represent.`, offset: lead, length: body.length };
  }
  if (expectedUnit !== undefined && unit !== '' && unit !== expectedUnit && !(expectedUnit === '' && unit === '%')) {
    const unitOffset = suffixOffset + (scale !== 1 ? 1 : 0);
    return {
      ok: false,
      code: 'unit-mismatch',
      message: `\`${unit}\` does not fit ${slot}: expected ${unitName(expectedUnit)}.`,
      hint: expectedUnit === '' ? 'write the number without a unit' : `write the value in ${expectedUnit}`,
      offset: unitOffset,
      length: suffix.length - (scale !== 1 ? 1 : 0),
    };
  }
  return { ok: true, value, unit };
}
