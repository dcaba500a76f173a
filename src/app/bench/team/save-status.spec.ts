import { saveStatus, type SaveStatusInput } from './save-status';

describe('saveStatus (the save-state line)', () => {
  const team = (over: Partial<NonNullable<SaveStatusInput['team']>> = {}): SaveStatusInput => ({
    local: 'saved',
    hasDraft: true,
    team: { baseVersion: 3, dirty: false, canWrite: true, state: 'idle', ...over },
  });

  it('keeps the words of a draft that is only in this browser', () => {
    expect(saveStatus({ local: 'saved', hasDraft: true }).text).toBe('Saved in this browser');
    expect(saveStatus({ local: 'saved', hasDraft: false }).text).toBe('Edits will be kept as a draft');
    expect(saveStatus({ local: 'unsaved', hasDraft: true })).toEqual({ text: 'Not saved yet', tone: 'warn' });
    expect(saveStatus({ local: 'saving', hasDraft: true }).text).toBe('Saving…');
  });

  it('names the team version a linked draft is saved as, or its unsaved changes', () => {
    expect(saveStatus(team())).toEqual({ text: 'Saved to team · v3', tone: 'ok' });
    expect(saveStatus(team({ dirty: true }))).toEqual({ text: 'Unsaved changes (team v3)', tone: 'warn' });
    expect(saveStatus(team({ dirty: true, state: 'saving' })).text).toBe('Saving to team…');
  });

  it('says where the text is when the team save did not happen', () => {
    expect(saveStatus(team({ dirty: true, state: 'offline' })).text).toBe('Saved in this browser; team server offline — will be saved when back online');
    expect(saveStatus(team({ dirty: true, state: 'conflict', conflictVersion: 5 })).text).toBe('Not saved to team: the team copy changed (now v5) — Save to compare');
    expect(saveStatus(team({ dirty: true, state: 'signed-out' })).text).toBe('Saved in this browser; sign in to save to the team');
    expect(saveStatus(team({ dirty: true, state: 'gone' })).text).toBe('Saved in this browser; the team netlist was deleted');
    expect(saveStatus(team({ dirty: true, state: 'failed' })).text).toBe('Saved in this browser; the team save failed (team v3)');
  });

  it('tells a viewer that edits stay in this browser', () => {
    expect(saveStatus(team({ canWrite: false }))).toEqual({ text: 'Team v3 · Read-only for your role; edits stay in this browser', tone: 'ok' });
    expect(saveStatus(team({ canWrite: false, dirty: true })).tone).toBe('warn');
  });
});
