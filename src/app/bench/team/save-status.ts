/**
 * The one line beside the title that says where the text is safe: in this browser, on the team
 * server (which version), or waiting for the server. Worded here, in one pure function, so the
 * sentences are tested and stay consistent.
 */
import type { SaveState } from '../bench-store';

/** Where the last save to the team server stands. */
export type TeamState =
  /** Nothing pending, or the last save went through. */
  | 'idle'
  | 'saving'
  /** The server could not be reached: the draft waits here with its base version. */
  | 'offline'
  /** The team copy moved on since the base version (a 409 not yet resolved). */
  | 'conflict'
  | 'signed-out'
  /** The server refused for this role (it changed since the page loaded). */
  | 'forbidden'
  /** The team netlist no longer exists (deleted). */
  | 'gone'
  | 'failed';

export interface SaveStatusInput {
  /** The draft in this browser. */
  local: SaveState;
  hasDraft: boolean;
  /** Set when the draft is linked to a team netlist. */
  team?: {
    baseVersion: number;
    /** The text differs from the team version it is based on. */
    dirty: boolean;
    /** The user's role lets them save to the netlist's workspace. */
    canWrite: boolean;
    state: TeamState;
    /** The newer team version seen in a conflict. */
    conflictVersion?: number;
  };
}

export type SaveTone = 'ok' | 'pending' | 'warn';

export interface SaveStatus {
  text: string;
  tone: SaveTone;
}

/** The save-state line for the file bar. */
export function saveStatus(input: SaveStatusInput): SaveStatus {
  const { local, hasDraft, team } = input;
  if (!team) {
    switch (local) {
      case 'saving': return { text: 'Saving…', tone: 'pending' };
      case 'unsaved': return { text: 'Not saved yet', tone: 'warn' };
      default: return { text: hasDraft ? 'Saved in this browser' : 'Edits will be kept as a draft', tone: 'ok' };
    }
  }
  const v = `v${team.baseVersion}`;
  if (!team.canWrite) return { text: `Team ${v} · Read-only for your role; edits stay in this browser`, tone: team.dirty ? 'warn' : 'ok' };
  if (team.state === 'saving') return { text: 'Saving to team…', tone: 'pending' };
  if (!team.dirty) return { text: `Saved to team · ${v}`, tone: 'ok' };
  switch (team.state) {
    case 'offline': return { text: 'Saved in this browser; team server offline — will be saved when back online', tone: 'warn' };
    case 'conflict': {
      const newer = team.conflictVersion ? ` (now v${team.conflictVersion})` : '';
      return { text: `Not saved to team: the team copy changed${newer} — Save to compare`, tone: 'warn' };
    }
    case 'signed-out': return { text: 'Saved in this browser; sign in to save to the team', tone: 'warn' };
    case 'forbidden': return { text: 'Saved in this browser; your role no longer allows saving to the team', tone: 'warn' };
    case 'gone': return { text: 'Saved in this browser; the team netlist was deleted', tone: 'warn' };
    case 'failed': return { text: `Saved in this browser; the team save failed (team ${v})`, tone: 'warn' };
    default: return { text: `Unsaved changes (team ${v})`, tone: 'warn' };
  }
}
