/**
 * What the results show, derived from a SolverClient's replies. The bench and the shared view
 * both read their numbers through this one class, so a reviewer opening a share link sees
 * exactly what the author's bench showed for the same text.
 */
import { computed, type Signal } from '@angular/core';
import type { Diagnostic, SolveResult } from '../../../solver';
import type { SolverClient } from './solver-client';
import { NO_NAMES, type NetlistNames, type SolveReply } from './solver-protocol';

export class SolveView {
  /** The newest result, for the newest text. */
  readonly latest: Signal<SolveResult | undefined>;
  /** Errors and warnings of the newest result, in text order. */
  readonly diagnostics: Signal<Diagnostic[]>;
  readonly errorCount: Signal<number>;
  readonly names: Signal<NetlistNames>;
  readonly solveMs: Signal<number | undefined>;
  /**
   * What the panels show: the newest result when it solved cleanly; while the text has errors
   * (half-typed words included) the last clean one, flagged `stale`, so the panels do not blink.
   */
  readonly shown: Signal<SolveResult | undefined>;
  /** The text of the shown result (its measure and check lines). */
  readonly shownText: Signal<string>;
  readonly stale: Signal<boolean>;

  constructor(client: SolverClient) {
    this.latest = computed(() => client.reply()?.result);
    this.diagnostics = computed(() => {
      const r = this.latest();
      return r ? [...r.errors, ...r.warnings].sort((a, b) => a.line - b.line || a.col - b.col) : [];
    });
    this.errorCount = computed(() => this.latest()?.errors.length ?? 0);
    this.names = computed(() => client.reply()?.names ?? NO_NAMES);
    this.solveMs = computed(() => client.reply()?.solveMs);
    const shownReply = computed<SolveReply | undefined>(() => {
      const reply = client.reply();
      if (!reply || reply.result.errors.length === 0) return reply;
      return client.lastClean() ?? reply;
    });
    this.shown = computed(() => shownReply()?.result);
    this.shownText = computed(() => shownReply()?.text ?? '');
    this.stale = computed(() => {
      const reply = client.reply();
      return !!reply && reply.result.errors.length > 0 && shownReply() !== reply;
    });
  }
}
