/**
 * The elaborator: turns parsed files into one flat Circuit. Block instances are expanded with
 * dotted names (`m1.qa`), pins mapped to the outer nodes, `gnd` kept global, parameters and
 * models evaluated in their lexical scope (a block sees its own params, those of the blocks it is
 * written in, and the top-level params of its file). Never throws; every problem is reported.
 */
import type { BlockDef, Body, FileUnit, ModelStmt, PartStmt, ValueText } from '../parse/ast';
import { evaluateExpression, type NameScope } from '../parse/expression';
import { OPTION_KEYS, PART_KINDS, rangeProblem, type Range } from '../language/part-kinds';
import type { QuantityUnit } from '../parse/quantity';
import { didYouMean } from '../parse/suggest';
import type { DiagnosticBag, DiagnosticCode, SourceLoc } from '../circuit/diagnostic';
import { buildPart, resolvePins, type PartContext, type ResolvedModel } from './elaborate-part';
import { evaluateModel } from './elaborate-model';
import { DEFAULT_OPTIONS, GROUND, partNodes, type Circuit, type Part, type PartKind } from '../circuit/types';
import { MAX_UNKNOWNS, partExtraUnknowns } from '../circuit/capacity';

/** Flattened parts beyond this are refused: a netlist this big is a runaway block expansion. */
export const MAX_PARTS = 100_000;
/** A circuit over the engine's MAX_UNKNOWNS is counted on up to this many unknowns (for the error), then elaboration stops. */
export const UNKNOWNS_COUNTED = 10 * MAX_UNKNOWNS;
/** Deepest chain of block instances. */
export const MAX_INSTANCE_DEPTH = 64;

export interface ElaborateOptions {
  /** Blocks brought in by `use`, per file, under their last path segment. */
  usedBlocks: Map<FileUnit, Map<string, BlockDef>>;
  /** Where each library file was brought in (its diagnostics point there). */
  useAnchors: Map<FileUnit, SourceLoc>;
  /** Block names whose `use` failed and was reported: their instances are broken, not unknown. */
  failedBlocks?: ReadonlySet<string>;
  /** Top-level parameter values that replace the written ones (used by `analyze vary`). */
  paramOverrides?: Record<string, number>;
}

export interface Elaboration {
  circuit: Circuit;
  /** Top-level parameter values (NaN for one that failed). */
  params: Map<string, number>;
  /** Nodes touched by parts that could not be built: topology checks stay quiet about them. */
  brokenNodes: Set<string>;
  /** Every flattened part name written, including parts that could not be built. */
  attemptedParts: Set<string>;
  /** Block instances that could not be expanded (reported): names inside them are not unknown. */
  brokenInstances: Set<string>;
  /** Models and blocks visible at the top level, for completion. */
  modelNames: string[];
  blocks: BlockDef[];
}

/**
 * Parameters of one scope layered over those of the enclosing scope, so that a block instance
 * does not copy every top-level parameter (a netlist may have thousands of both).
 */
class LayeredScope implements NameScope {
  readonly own = new Map<string, number>();
  constructor(private readonly parent?: LayeredScope) {}

  get(name: string): number | undefined {
    const v = this.own.get(name);
    return v !== undefined || this.own.has(name) ? v : this.parent?.get(name);
  }

  has(name: string): boolean {
    return this.own.has(name) || (this.parent?.has(name) ?? false);
  }

  set(name: string, value: number): void {
    this.own.set(name, value);
  }

  *keys(): IterableIterator<string> {
    yield* this.own.keys();
    if (this.parent) for (const k of this.parent.keys()) if (!this.own.has(k)) yield k;
  }
}

/** One scope: the top level of a file, or one block instance. */
interface Frame {
  file: FileUnit;
  body: Body;
  block?: BlockDef;
  /** Prefix of flattened names: '' at the top, `m1.` inside instance m1. */
  prefix: string;
  params: LayeredScope;
  pinMap?: Map<string, string>;
  /** The scope this body is written in (for params, models and blocks). */
  lexical?: Frame;
  models: Map<string, ResolvedModel | 'failed'>;
  /** Library files: where in the user's netlist the problem shows. */
  anchor?: SourceLoc;
  /** Block definitions being instantiated, outermost first (recursion detection). */
  chain: BlockDef[];
  partContext?: PartContext;
}

/** Where elaborated parts go (a scratch sink checks unused blocks). */
interface Sink {
  parts: Part[];
  nodes: Set<string>;
}

class Elaborator {
  private partCount = 0;
  private tooLarge = false;
  /** MNA unknowns of the main circuit so far (nodes, internal nodes, branch currents). */
  private unknowns = 0;
  /** Where the main circuit first went over MAX_UNKNOWNS; from then on it is only counted. */
  private overCapacity: { frame: Frame; loc: SourceLoc } | undefined;
  /** The top-level line being elaborated (a part, or the instance whose blocks are expanding). */
  private topLine: { frame: Frame; loc: SourceLoc } | undefined;
  private readonly instantiated = new Set<BlockDef>();
  private readonly firstFrame = new Map<BlockDef, Frame>();
  private readonly fileFrames = new Map<FileUnit, Frame>();
  readonly brokenNodes = new Set<string>();
  /** Every flattened part name written, built or not. */
  readonly attemptedParts = new Set<string>();
  /** Instances of unknown, failed or recursive blocks. */
  readonly brokenInstances = new Set<string>();

  mainSink: Sink | undefined;

  constructor(
    private readonly bag: DiagnosticBag,
    private readonly options: ElaborateOptions,
  ) {}

  report(frame: Frame, severity: 'error' | 'warning', code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void {
    if (frame.file.origin) {
      message = `In \`${frame.file.origin}\` line ${loc.line}: ${message}`;
      loc = frame.anchor ?? loc;
    }
    if (severity === 'error') this.bag.error(code, loc, message, hint);
    else this.bag.warning(code, loc, message, hint);
  }

  /** Evaluates a value in a frame; NaN (reported) on failure. */
  evaluate(frame: Frame, value: ValueText, unit: QuantityUnit | undefined, slot: string, range: Range): number {
    const result = evaluateExpression(value.text, frame.params, unit, slot);
    if (!result.ok) {
      for (const p of result.problems) {
        this.report(frame, 'error', p.code, value.line.loc(value.start + p.offset, value.start + p.offset + Math.max(1, p.length)), p.message, p.hint);
      }
      return NaN;
    }
    const problem = rangeProblem(result.value, range);
    if (problem) {
      this.report(frame, 'error', 'bad-value', value.loc, `${capitalize(slot)} ${problem}; it is ${result.value}.`);
      return NaN;
    }
    return result.value;
  }

  /** Evaluates `param` lines into `params`, honouring overrides. */
  private evaluateParams(frame: Frame, overrides?: Map<string, number>): void {
    const seen = new Set<string>();
    for (const p of frame.body.params) {
      const name = p.name.text;
      if (name === GROUND) {
        this.report(frame, 'error', 'gnd-redefined', p.name.loc, '`gnd` is the reference node and cannot be redefined.');
        continue;
      }
      if (seen.has(name)) {
        this.report(frame, 'error', 'duplicate-name', p.name.loc, `The parameter \`${name}\` is defined twice.`);
        continue;
      }
      seen.add(name);
      if (overrides?.has(name)) frame.params.set(name, overrides.get(name) as number);
      else frame.params.set(name, p.value ? this.evaluate(frame, p.value, undefined, `the parameter \`${name}\``, 'any') : NaN);
    }
  }

  /** Evaluates the `model` lines of a frame's body. */
  private evaluateModels(frame: Frame): void {
    for (const m of frame.body.models) {
      if (m.name.text === GROUND) {
        this.report(frame, 'error', 'gnd-redefined', m.name.loc, '`gnd` is the reference node and cannot name a model.');
        continue;
      }
      if (frame.models.has(m.name.text)) {
        this.report(frame, 'error', 'duplicate-name', m.name.loc, `The model \`${m.name.text}\` is defined twice.`);
        continue;
      }
      frame.models.set(m.name.text, this.model(frame, m));
    }
  }

  private model(frame: Frame, stmt: ModelStmt): ResolvedModel | 'failed' {
    return evaluateModel(stmt, {
      report: (code, loc, message, hint) => this.report(frame, 'error', code, loc, message, hint),
      evaluate: (v, unit, slot, range) => this.evaluate(frame, v, unit, slot, range),
    });
  }

  private checkBlockNames(frame: Frame): void {
    const seen = new Set<string>();
    for (const b of frame.body.blocks) {
      const name = b.name.text;
      if (name === GROUND) this.report(frame, 'error', 'gnd-redefined', b.name.loc, '`gnd` is the reference node and cannot name a block.');
      else if (name in PART_KINDS) this.report(frame, 'error', 'duplicate-name', b.name.loc, `The block \`${name}\` has the name of a built-in kind.`, 'choose another name');
      else if (seen.has(name)) this.report(frame, 'error', 'duplicate-name', b.name.loc, `The block \`${name}\` is defined twice.`);
      seen.add(name);
    }
  }

  /** The top-level frame of a file (library files get theirs on first use). */
  fileFrame(file: FileUnit): Frame {
    let frame = this.fileFrames.get(file);
    if (!frame) {
      frame = { file, body: file, prefix: '', params: new LayeredScope(), models: new Map(), anchor: this.options.useAnchors.get(file), chain: [] };
      this.fileFrames.set(file, frame);
      const overrides = file.origin ? undefined : new Map(Object.entries(this.options.paramOverrides ?? {}));
      this.evaluateParams(frame, overrides);
      this.evaluateModels(frame);
      this.checkBlockNames(frame);
    }
    return frame;
  }

  private lookupModel(frame: Frame, name: string): ResolvedModel | 'failed' | undefined {
    for (let f: Frame | undefined = frame; f; f = f.lexical) {
      const m = f.models.get(name);
      if (m) return m;
    }
    return undefined;
  }

  private modelNames(frame: Frame): string[] {
    const names: string[] = [];
    for (let f: Frame | undefined = frame; f; f = f.lexical) names.push(...f.models.keys());
    return names;
  }

  private lookupBlock(frame: Frame, name: string): BlockDef | undefined {
    for (let f: Frame | undefined = frame; f; f = f.lexical) {
      const b = f.body.blocks.find((x) => x.name.text === name);
      if (b) return b;
      if (!f.lexical) return this.options.usedBlocks.get(f.file)?.get(name);
    }
    return undefined;
  }

  private blockNames(frame: Frame): string[] {
    const names: string[] = [];
    for (let f: Frame | undefined = frame; f; f = f.lexical) {
      names.push(...f.body.blocks.map((b) => b.name.text));
      if (!f.lexical) names.push(...(this.options.usedBlocks.get(f.file)?.keys() ?? []));
    }
    return names;
  }

  /** Flattened node name of a node written in `frame`. */
  private node(frame: Frame, name: string): string {
    if (name === GROUND) return GROUND;
    const pin = frame.pinMap?.get(name);
    if (pin !== undefined) return pin;
    return frame.prefix + name;
  }

  /** Elaborates every part of a frame's body into `sink`. */
  elaborateBody(frame: Frame, sink: Sink): void {
    const names = new Set<string>();
    for (const stmt of frame.body.parts) {
      if (this.tooLarge) return;
      const name = stmt.name.text;
      if (name === GROUND) {
        this.report(frame, 'error', 'gnd-redefined', stmt.name.loc, '`gnd` is the reference node and cannot name a part.');
        continue;
      }
      if (names.has(name)) {
        this.report(frame, 'error', 'duplicate-name', stmt.name.loc, `The name \`${name}\` is already used by another part.`, 'every part needs its own name');
        continue;
      }
      names.add(name);
      if (sink === this.mainSink) this.attemptedParts.add(frame.prefix + name);
      if (sink === this.mainSink && frame.prefix === '' && !frame.file.origin) this.topLine = { frame, loc: stmt.loc };
      this.elaboratePart(frame, stmt, sink);
    }
  }

  private markBroken(frame: Frame, stmt: PartStmt): void {
    for (const c of stmt.conns) this.brokenNodes.add(this.node(frame, c.node.text));
  }

  /** An instance whose block could not be expanded: its inner names exist only as intended. */
  private markBrokenInstance(frame: Frame, stmt: PartStmt): void {
    this.markBroken(frame, stmt);
    this.brokenInstances.add(frame.prefix + stmt.name.text);
  }

  private elaboratePart(frame: Frame, stmt: PartStmt, sink: Sink): void {
    const kind = stmt.partKind.text;
    const spec = Object.prototype.hasOwnProperty.call(PART_KINDS, kind) ? PART_KINDS[kind as PartKind] : undefined;
    if (spec) {
      const ctx = this.partContext(frame);
      ctx.partName = frame.prefix + stmt.name.text;
      const part = buildPart(ctx, stmt, spec);
      if (!part) {
        this.markBroken(frame, stmt);
        return;
      }
      if (frame.file.origin && frame.anchor) part.loc = frame.anchor;
      this.addPart(frame, part, sink);
      return;
    }
    const block = this.lookupBlock(frame, kind);
    if (block) {
      this.instantiate(frame, stmt, block, sink);
      return;
    }
    this.markBrokenInstance(frame, stmt);
    if (this.options.failedBlocks?.has(kind)) return; // its `use` line already says why
    const isModel = this.lookupModel(frame, kind);
    const hint = isModel && isModel !== 'failed'
      ? `\`${kind}\` is a model: write \`${stmt.name.text}: ${isModel.kind}(…) ${kind}\``
      : didYouMean(kind, [...Object.keys(PART_KINDS), ...this.blockNames(frame)]) ?? `kinds are ${Object.keys(PART_KINDS).join(', ')}, or a block's name`;
    this.report(frame, 'error', 'unknown-kind', stmt.partKind.loc, `Unknown part kind or block \`${kind}\`.`, hint);
  }

  /** One PartContext per frame, reused for each of its parts (a netlist may have many). */
  private partContext(frame: Frame): PartContext {
    if (!frame.partContext) {
      frame.partContext = {
        report: (severity, code, loc, message, hint) => this.report(frame, severity, code, loc, message, hint),
        evaluate: (v, unit, slot, range) => this.evaluate(frame, v, unit, slot, range),
        node: (n) => this.node(frame, n),
        model: (n) => this.lookupModel(frame, n),
        modelNames: () => this.modelNames(frame),
        partName: '',
      };
    }
    return frame.partContext;
  }

  private addPart(frame: Frame, part: Part, sink: Sink): void {
    if (++this.partCount > MAX_PARTS) {
      this.tooLarge = true;
      // Over the unknowns' cap already: that error says it (with the count so far).
      if (!this.overCapacity) this.report(frame, 'error', 'too-large', part.loc, `The circuit has more than ${MAX_PARTS} parts once its blocks are expanded.`, 'check for a block that instantiates far more copies than intended');
      return;
    }
    if (sink !== this.mainSink) {
      sink.parts.push(part);
      for (const n of partNodes(part)) if (n !== GROUND) sink.nodes.add(n);
      return;
    }
    // The main circuit's unknowns, counted as it grows. Past the engine's cap the parts are no
    // longer kept (the circuit is refused) but still counted, up to UNKNOWNS_COUNTED, so the
    // error can give the size; then elaboration stops.
    for (const n of partNodes(part)) {
      if (n === GROUND || sink.nodes.has(n)) continue;
      sink.nodes.add(n);
      this.unknowns++;
    }
    this.unknowns += partExtraUnknowns(part);
    // The error points at the top-level line that crossed the cap: the instance, not a part deep inside it.
    if (this.unknowns > MAX_UNKNOWNS && !this.overCapacity) this.overCapacity = this.topLine ?? { frame, loc: part.loc };
    if (!this.overCapacity) {
      sink.parts.push(part);
      return;
    }
    // A part left out: its nodes' connections are incomplete, so topology checks stay quiet about them.
    for (const n of partNodes(part)) this.brokenNodes.add(n);
    if (this.unknowns > UNKNOWNS_COUNTED) this.tooLarge = true;
  }

  /** The error for a main circuit over MAX_UNKNOWNS, at the part that crossed it. */
  reportCapacity(): void {
    if (!this.overCapacity) return;
    const count = this.unknowns.toLocaleString('en-US');
    this.report(this.overCapacity.frame, 'error', 'too-large', this.overCapacity.loc,
      `The circuit has ${this.tooLarge ? `more than ${Math.min(this.unknowns, UNKNOWNS_COUNTED).toLocaleString('en-US')}` : count} unknowns (node voltages and branch currents) once its blocks are expanded; the engine holds at most ${MAX_UNKNOWNS.toLocaleString('en-US')}.`,
      'check for a block that instantiates far more copies than intended, or solve a smaller part of the circuit');
  }

  /** Expands one block instance. */
  private instantiate(caller: Frame, stmt: PartStmt, def: BlockDef, sink: Sink): void {
    const chainNames = [...caller.chain, def].map((b) => b.name.text);
    if (caller.chain.includes(def)) {
      this.markBrokenInstance(caller, stmt);
      this.report(caller, 'error', 'recursive-block', stmt.partKind.loc, `The block \`${def.name.text}\` contains itself (${chainNames.join(' → ')}).`, 'a block cannot instantiate itself, directly or through another block');
      return;
    }
    if (caller.chain.length >= MAX_INSTANCE_DEPTH) {
      this.markBrokenInstance(caller, stmt);
      this.report(caller, 'error', 'recursive-block', stmt.partKind.loc, `Blocks are nested more than ${MAX_INSTANCE_DEPTH} instances deep.`);
      return;
    }
    const pinNames = def.pins.map((p) => p.text);
    const ctx: PartContext = {
      report: (severity, code, loc, message, hint) => this.report(caller, severity, code, loc, message, hint),
      evaluate: (v, unit, slot, range) => this.evaluate(caller, v, unit, slot, range),
      node: (n) => this.node(caller, n),
      model: () => undefined,
      modelNames: () => [],
      partName: caller.prefix + stmt.name.text,
    };
    const pins = resolvePins(ctx, stmt, pinNames, true, def.name.text);
    if (stmt.main) this.report(caller, 'error', 'syntax', stmt.main.loc, `A block instance takes no main value; write its parameters as \`key=value\`.`, def.params.length ? `its parameters are ${def.params.map((p) => p.name.text).join(', ')}` : undefined);
    const overrides = new Map<string, number>();
    const paramNames = def.params.map((p) => p.name.text);
    for (const kv of stmt.keys) {
      if (!paramNames.includes(kv.key.text)) {
        this.report(caller, 'error', 'unknown-param', kv.key.loc, `The block \`${def.name.text}\` has no parameter \`${kv.key.text}\`.`, didYouMean(kv.key.text, paramNames) ?? (paramNames.length ? `its parameters are ${paramNames.join(', ')}` : 'it has no parameters'));
      } else if (overrides.has(kv.key.text)) {
        this.report(caller, 'error', 'duplicate-name', kv.key.loc, `\`${kv.key.text}=\` is given twice.`);
      } else if (kv.value) {
        overrides.set(kv.key.text, this.evaluate(caller, kv.value, undefined, `the parameter \`${kv.key.text}\` of \`${stmt.name.text}\``, 'any'));
      }
    }
    const pinMap = new Map<string, string>();
    for (const p of pinNames) {
      const written = pins?.get(p);
      pinMap.set(p, written ? this.node(caller, written.text) : caller.prefix + stmt.name.text + '.' + p);
    }
    if (!pins) {
      this.markBroken(caller, stmt);
      // The instance's pins stand unconnected (already reported): no "no DC path" about them.
      for (const node of pinMap.values()) this.brokenNodes.add(node);
    }
    const lexical = this.lexicalFrame(caller, def);
    const frame: Frame = {
      file: def.file,
      body: def,
      block: def,
      prefix: caller.prefix + stmt.name.text + '.',
      params: new LayeredScope(lexical.params),
      pinMap,
      lexical,
      models: new Map(),
      // Library blocks report at the user's outermost instance line.
      anchor: caller.file.origin ? caller.anchor : def.file.origin ? stmt.loc : undefined,
      chain: [...caller.chain, def],
    };
    this.instantiated.add(def);
    if (!this.firstFrame.has(def)) this.firstFrame.set(def, frame);
    this.evaluateParams(frame, overrides);
    this.evaluateModels(frame);
    this.checkBlockNames(frame);
    this.elaborateBody(frame, sink);
  }

  /** The frame a block definition is written in, found from the instantiating frame. */
  private lexicalFrame(caller: Frame, def: BlockDef): Frame {
    if (!def.parent) return this.fileFrame(def.file);
    for (let f: Frame | undefined = caller; f; f = f.lexical) if (f.block === def.parent) return f;
    return this.firstFrame.get(def.parent) ?? this.fileFrame(def.file);
  }

  /**
   * Elaborates the blocks of the main file that no instance reached, into a scratch sink, so that
   * their mistakes are reported even before they are used.
   */
  checkUnusedBlocks(file: FileUnit): void {
    const all: BlockDef[] = [];
    const collect = (body: Body): void => {
      for (const b of body.blocks) {
        all.push(b);
        collect(b);
      }
    };
    collect(file);
    for (const def of all) {
      if (this.instantiated.has(def) || this.tooLarge) continue;
      const lexical = def.parent ? this.firstFrame.get(def.parent) : this.fileFrame(file);
      if (!lexical) continue;
      const frame: Frame = {
        file, body: def, block: def, prefix: `${def.name.text}.`, params: new LayeredScope(lexical.params),
        pinMap: new Map(def.pins.map((p) => [p.text, `${def.name.text}.${p.text}`])), lexical, models: new Map(), chain: [...lexical.chain, def],
      };
      this.instantiated.add(def);
      this.firstFrame.set(def, frame);
      this.evaluateParams(frame);
      this.evaluateModels(frame);
      this.checkBlockNames(frame);
      this.elaborateBody(frame, { parts: [], nodes: new Set() });
    }
  }

  /** `option` lines → SolverOptions. */
  options_(file: FileUnit, top: Frame): Circuit['options'] {
    const options = { ...DEFAULT_OPTIONS };
    const seen = new Set<string>();
    for (const o of file.options) {
      const spec = OPTION_KEYS[o.name.text];
      if (!Object.prototype.hasOwnProperty.call(OPTION_KEYS, o.name.text) || !spec) {
        this.report(top, 'error', 'unknown-option', o.name.loc, `Unknown option \`${o.name.text}\`.`, didYouMean(o.name.text, Object.keys(OPTION_KEYS)) ?? `options are ${Object.keys(OPTION_KEYS).join(', ')}`);
        continue;
      }
      if (seen.has(o.name.text)) this.report(top, 'warning', 'duplicate-name', o.name.loc, `The option \`${o.name.text}\` is set twice; the last one counts.`);
      seen.add(o.name.text);
      if (!o.value) continue;
      let value = this.evaluate(top, o.value, spec.unit, `the option \`${o.name.text}\``, spec.range);
      if (spec.field === 'temp' && value <= -273.15) {
        this.report(top, 'error', 'bad-value', o.value.loc, `The temperature ${value} °C is below absolute zero.`);
        value = NaN;
      }
      if (!Number.isNaN(value)) options[spec.field] = value;
    }
    return options;
  }
}

function capitalize(s: string): string {
  return s.length ? s[0].toUpperCase() + s.slice(1) : s;
}

/** Flattens the main file into a Circuit. Never throws. */
export function elaborate(file: FileUnit, bag: DiagnosticBag, options: ElaborateOptions): Elaboration {
  const e = new Elaborator(bag, options);
  const top = e.fileFrame(file);
  const sink: Sink = { parts: [], nodes: new Set() };
  e.mainSink = sink;
  const circuitOptions = e.options_(file, top);
  e.elaborateBody(top, sink);
  e.reportCapacity();
  e.checkUnusedBlocks(file);
  const blocks = [...file.blocks, ...(options.usedBlocks.get(file)?.values() ?? [])];
  return {
    circuit: { title: file.title ?? '', nodes: [...sink.nodes], parts: sink.parts, options: circuitOptions },
    params: top.params.own,
    brokenNodes: e.brokenNodes,
    attemptedParts: e.attemptedParts,
    brokenInstances: e.brokenInstances,
    modelNames: [...top.models.keys()],
    blocks,
  };
}
