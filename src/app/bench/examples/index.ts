/**
 * The demo netlists: the front end of "Strainlab", a fictional bridge-sensor product, grown in
 * four steps from a resistor-tail pair to a cascoded pair with a follower level shift. The numbers
 * are invented for the demo; each netlist's checks pass as written.
 */
import type { Example } from './example';
import { CASCODED_FOLLOWER } from './cascoded-follower';
import { MIRROR_LOADED } from './mirror-loaded';
import { MIRRORED_TAIL } from './mirrored-tail';
import { RESISTOR_TAIL } from './resistor-tail';

export type { Example } from './example';

export const EXAMPLES: readonly Example[] = [RESISTOR_TAIL, MIRRORED_TAIL, MIRROR_LOADED, CASCODED_FOLLOWER];

export function exampleById(id: string | null | undefined): Example | undefined {
  return EXAMPLES.find((e) => e.id === id);
}
