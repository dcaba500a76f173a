/**
 * The operating point as table rows, with what a designer checks first: is every device in its
 * intended region, with headroom? Regions come from the solver; headroom uses the usual rules
 * of thumb (VCE ≥ 0.3 V for a bipolar in its active region, VDS at least 0.1 V beyond Vov for MOS).
 */
import type { BjtOp, DeviceOp, DiodeOp, MosOp, OpResult } from '../../../../../solver';
import { formatSi } from '../si-format';
import type { CellFlag, OpColumn } from './op-table';

/** Below this |VCE| an active bipolar is close to saturation (common practice: VCE(sat) ≈ 0.2 V plus margin). */
export const BJT_HEADROOM_V = 0.3;
/** A saturated MOS with |VDS| − Vov below this is at the edge of triode (common practice). */
export const MOS_HEADROOM_V = 0.1;

export type BjtRow = BjtOp & { name: string };
export type MosRow = MosOp & { name: string };
export type DiodeRow = DiodeOp & { name: string };
export interface NodeRow { name: string; v: number }
export interface BranchRow {
  name: string;
  /** The part's kind as the netlist writes it (`vsrc`, `isrc`, `res` …), when known. */
  kind?: string;
  v: number;
  i: number;
  p: number;
}

/** One device that needs attention, for the summary. */
export interface Problem { name: string; text: string }

const REGION_WORDS: Record<string, string> = {
  active: 'active', saturated: 'saturated', cutoff: 'cut off', reverse: 'reverse active',
  saturation: 'saturation', triode: 'triode',
};

/** The word for a region ("cut off", not "cutoff"). */
export function regionWord(region: string): string {
  return REGION_WORDS[region] ?? region;
}

/** The region as a flag when it is not the one an amplifier device should be in. */
export function regionFlag(d: DeviceOp): CellFlag | undefined {
  if (d.kind === 'npn' || d.kind === 'pnp') {
    if (d.region === 'saturated') return { text: 'saturated', detail: 'collector junction forward-biased: the device no longer amplifies' };
    if (d.region === 'cutoff') return { text: 'cut off', detail: 'base–emitter junction not conducting: no useful current' };
    if (d.region === 'reverse') return { text: 'reverse active', detail: 'collector and emitter roles swapped: check the connections' };
    return undefined;
  }
  if (d.kind === 'nmos' || d.kind === 'pmos') {
    if (d.region === 'triode') return { text: 'triode', detail: '|VDS| below Vov: the device behaves as a resistor' };
    if (d.region === 'cutoff') return { text: 'cut off', detail: 'gate drive below threshold: no current' };
  }
  return undefined;
}

/** A headroom warning for a device that is in its region but close to leaving it. */
export function headroomFlag(d: DeviceOp): CellFlag | undefined {
  if ((d.kind === 'npn' || d.kind === 'pnp') && d.region === 'active') {
    // The solver reports pnp voltages mirrored (vce = v(e) − v(c), positive when active).
    if (d.vce < BJT_HEADROOM_V) return { text: `${d.kind === 'npn' ? 'VCE' : 'VEC'} < 0.3 V`, detail: 'little headroom before saturation' };
  }
  if ((d.kind === 'nmos' || d.kind === 'pmos') && d.region === 'saturation') {
    if (Math.abs(d.vds) - d.vov < MOS_HEADROOM_V) return { text: '|VDS| − Vov < 0.1 V', detail: 'at the edge of triode' };
  }
  return undefined;
}

/** Every device that needs attention, in name order. */
export function deviceProblems(op: OpResult): Problem[] {
  const out: Problem[] = [];
  for (const [name, d] of Object.entries(op.devices)) {
    const region = regionFlag(d);
    const headroom = headroomFlag(d);
    if (region) out.push({ name, text: `${region.text}${vText(d)}` });
    else if (headroom) out.push({ name, text: `${headroom.text}${vText(d)}` });
  }
  return out.sort((a, b) => a.name.localeCompare(b.name, 'en', { numeric: true }));
}

function vText(d: DeviceOp): string {
  if (d.kind === 'npn' || d.kind === 'pnp') return ` (VCE = ${formatSi(d.vce, 'V')}, VBE = ${formatSi(d.vbe, 'V')})`;
  if (d.kind === 'nmos' || d.kind === 'pmos') return ` (VDS = ${formatSi(d.vds, 'V')}, Vov = ${formatSi(d.vov, 'V')})`;
  return '';
}

/** Devices split by family, each with its name. */
export function deviceRows(op: OpResult): { bjt: BjtRow[]; mos: MosRow[]; diode: DiodeRow[] } {
  const bjt: BjtRow[] = [];
  const mos: MosRow[] = [];
  const diode: DiodeRow[] = [];
  for (const [name, d] of Object.entries(op.devices) as Array<[string, DeviceOp]>) {
    if (d.kind === 'npn' || d.kind === 'pnp') bjt.push({ ...d, name });
    else if (d.kind === 'nmos' || d.kind === 'pmos') mos.push({ ...d, name });
    else if (d.kind === 'diode') diode.push({ ...d, name });
  }
  return { bjt, mos, diode };
}

/** Voltage sources and two-terminal parts with the power each absorbs (v·i; negative delivers). */
export function branchRows(entries: Record<string, { v: number; i: number }>): BranchRow[] {
  return Object.entries(entries).map(([name, b]) => ({ name, v: b.v, i: b.i, p: b.v * b.i }));
}

/** Kinds that are sources, wherever the op report files them. */
const SOURCE_KINDS = new Set(['vsrc', 'isrc', 'vcvs', 'vccs']);

/**
 * Sources and parts as the bias panel groups them: every source together — voltage, current and
 * controlled — and the passive parts apart, each group in netlist order. The op report files
 * current sources and transconductors with the parts (their current is what is known about
 * them); `kinds` (part name → kind, in the order the netlist writes the parts) tells them apart.
 * Without kinds the report's own grouping stands.
 */
export function branchGroups(op: OpResult, kinds: ReadonlyMap<string, string>): { sources: BranchRow[]; parts: BranchRow[] } {
  const withKind = (row: BranchRow): BranchRow => (kinds.has(row.name) ? { ...row, kind: kinds.get(row.name) } : row);
  const sources = branchRows(op.sources).map(withKind);
  const parts: BranchRow[] = [];
  for (const row of branchRows(op.parts).map(withKind)) (row.kind && SOURCE_KINDS.has(row.kind) ? sources : parts).push(row);
  return { sources: inNetlistOrder(sources, kinds), parts };
}

/** Rows by their part's place in the netlist; rows the netlist does not name (inside blocks) keep their order, after. */
function inNetlistOrder(rows: BranchRow[], kinds: ReadonlyMap<string, string>): BranchRow[] {
  const place = new Map([...kinds.keys()].map((name, k) => [name, k]));
  return rows
    .map((row, index) => ({ row, index, at: place.get(row.name) ?? Number.MAX_SAFE_INTEGER }))
    .sort((a, b) => a.at - b.at || a.index - b.index)
    .map((x) => x.row);
}

const name = <R extends { name: string }>(): OpColumn<R> => ({ id: 'name', header: 'Name', title: 'name', text: (r) => r.name, sortValue: (r) => r.name });
const num = <R>(id: string, header: string, title: string, unit: string, get: (r: R) => number, flag?: (r: R) => CellFlag | undefined): OpColumn<R> => ({
  id, header, title, numeric: true, text: (r) => formatSi(get(r), unit), sortValue: (r) => get(r), flag,
});
const region = <R extends DeviceOp>(): OpColumn<R> => ({
  id: 'region', header: 'Region', title: 'operating region', tag: true,
  text: (r) => regionWord(r.region), sortValue: (r) => regionWord(r.region), flag: (r) => regionFlag(r),
});
const kind = <R extends DeviceOp>(): OpColumn<R> => ({ id: 'kind', header: 'Kind', title: 'kind', text: (r) => r.kind, sortValue: (r) => r.kind });

export const BJT_COLUMNS: readonly OpColumn<BjtRow>[] = [
  name(), kind(), region(),
  num('ic', 'IC', 'collector current', 'A', (r) => r.ic),
  num('vbe', 'VBE', 'base–emitter voltage', 'V', (r) => r.vbe),
  num('vce', 'VCE', 'collector–emitter voltage', 'V', (r) => r.vce, (r) => headroomFlag(r)),
  num('gm', 'gm', 'transconductance', 'S', (r) => r.gm),
  num('rpi', 'rπ', 'base input resistance rπ', 'Ω', (r) => r.rpi),
  num('ro', 'ro', 'output resistance (Early effect)', 'Ω', (r) => r.ro),
  num('cpi', 'Cπ', 'base–emitter capacitance Cπ', 'F', (r) => r.cpi),
  num('cmu', 'Cμ', 'base–collector capacitance Cμ', 'F', (r) => r.cmu),
];

export const MOS_COLUMNS: readonly OpColumn<MosRow>[] = [
  name(), kind(), region(),
  num('id', 'ID', 'drain current', 'A', (r) => r.id),
  num('vgs', 'VGS', 'gate–source voltage', 'V', (r) => r.vgs),
  num('vds', 'VDS', 'drain–source voltage', 'V', (r) => r.vds, (r) => headroomFlag(r)),
  num('vov', 'Vov', 'overdrive voltage VGS − Vth', 'V', (r) => r.vov),
  num('gm', 'gm', 'transconductance', 'S', (r) => r.gm),
  num('gds', 'gds', 'output conductance', 'S', (r) => r.gds),
  num('cgs', 'Cgs', 'gate–source capacitance', 'F', (r) => r.cgs),
  num('cgd', 'Cgd', 'gate–drain capacitance', 'F', (r) => r.cgd),
];

export const DIODE_COLUMNS: readonly OpColumn<DiodeRow>[] = [
  name(),
  { ...region<DiodeRow>(), flag: undefined, text: (r) => r.region, sortValue: (r) => r.region },
  num('id', 'ID', 'diode current', 'A', (r) => r.id),
  num('vd', 'VD', 'diode voltage', 'V', (r) => r.vd),
  num('gd', 'gd', 'small-signal conductance', 'S', (r) => r.gd),
  num('cj', 'Cj', 'junction capacitance', 'F', (r) => r.cj),
];

export const NODE_COLUMNS: readonly OpColumn<NodeRow>[] = [name(), num('v', 'Voltage', 'voltage to gnd', 'V', (r) => r.v)];

/** Columns of sources (current p→n) or parts (current a→b); power as absorbed (negative delivers). */
export function branchColumns(current: string): readonly OpColumn<BranchRow>[] {
  return [
    name(),
    { id: 'kind', header: 'Kind', title: 'kind', text: (r) => r.kind ?? '', sortValue: (r) => r.kind ?? '' },
    num('v', 'Voltage', 'voltage across', 'V', (r) => r.v),
    num('i', `Current ${current}`, `current ${current}`, 'A', (r) => r.i),
    {
      id: 'p', header: 'Power', title: 'power (delivered or absorbed)', numeric: true,
      text: (r) => (Math.abs(r.p) < 1e-15 ? '0 W' : `${formatSi(Math.abs(r.p), 'W')} ${r.p < 0 ? 'delivered' : 'absorbed'}`),
      sortValue: (r) => r.p,
    },
  ];
}
