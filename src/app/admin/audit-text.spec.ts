import { actionLabel, detailsText, targetText } from './audit-text';

describe('actionLabel', () => {
  it('turns dotted codes into words', () => {
    expect(actionLabel('member.role_change')).toBe('Member role change');
    expect(actionLabel('netlist.delete')).toBe('Netlist delete');
  });
});

describe('targetText', () => {
  it('names the target by the name, address or file its details carry', () => {
    expect(targetText({ targetType: 'netlist', targetId: 'a1b2c3d4e5f6', details: { name: 'Mirror-loaded pair' } })).toBe('netlist “Mirror-loaded pair”');
    expect(targetText({ targetType: 'user', targetId: 'x', details: { email: 'mei@strainlab.example', from: 'designer', to: 'reviewer' } })).toBe('user “mei@strainlab.example”');
    expect(targetText({ targetType: 'netlist', targetId: 'x', details: { file: 'pair.nwl' } })).toBe('netlist “pair.nwl”');
  });

  it('falls back to the kind in words and a short id', () => {
    expect(targetText({ targetType: 'share_link', targetId: 'a1b2c3d4e5f6', details: null })).toBe('share link a1b2c3d4');
    expect(targetText({ targetType: 'workspace', targetId: null, details: null })).toBe('workspace');
  });
});

describe('detailsText', () => {
  it('writes a change as from → to, leaving out what the target already says', () => {
    expect(detailsText({ email: 'mei@strainlab.example', from: 'designer', to: 'reviewer' })).toBe('designer → reviewer');
  });

  it('writes other fields as words with their values, shortening ids and nested objects', () => {
    expect(detailsText({ version: 7, from: 3 })).toBe('version: 7; from: 3');
    expect(detailsText({ version: 5, renamedFrom: 'Old pair', name: 'New pair' })).toBe('version: 5; renamed from: Old pair');
    expect(detailsText({ name: 'Pair', visibility: 'private', was: { name: 'Pair', visibility: 'workspace' } })).toBe('visibility: private; was: name Pair, visibility workspace');
    expect(detailsText({ netlist: '0f8e4d2a-1b3c-4d5e-8f90-123456789abc', version: 2, notify: [] })).toBe('netlist: 0f8e4d2a; version: 2');
  });

  it('stays short', () => {
    const text = detailsText({ note: 'x'.repeat(300) });
    expect(text.length).toBe(120);
    expect(text.endsWith('…')).toBe(true);
    expect(detailsText(null)).toBe('');
  });
});
