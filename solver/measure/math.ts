/**
 * The mathjs instance for measures and checks: only the functions the language offers, not
 * `create(all)`, so the Web Worker stays small (mathjs in full is ~190 kB gzip).
 */
import {
  absDependencies,
  addDependencies,
  complexDependencies,
  create,
  divideDependencies,
  eDependencies,
  evaluateDependencies,
  expDependencies,
  log10Dependencies,
  logDependencies,
  maxDependencies,
  minDependencies,
  multiplyDependencies,
  parseDependencies,
  piDependencies,
  powDependencies,
  sqrtDependencies,
  subtractDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
} from 'mathjs';

export const measureMath = create({
  absDependencies,
  addDependencies,
  complexDependencies,
  divideDependencies,
  eDependencies,
  evaluateDependencies,
  expDependencies,
  log10Dependencies,
  logDependencies,
  maxDependencies,
  minDependencies,
  multiplyDependencies,
  parseDependencies,
  piDependencies,
  powDependencies,
  sqrtDependencies,
  subtractDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
});
