import type { Me } from '../core/team-api';
import { workspaceAccess } from './workspace-access';

const strainlab = { slug: 'strainlab', name: 'Strainlab sensor front end', role: 'designer' as const };
const tidepool = { slug: 'tidepool', name: 'Tidepool hydrophone preamp', role: 'admin' as const };
const me: Me = { user: { id: 'u1', name: 'Ravi Lindqvist', email: 'ravi@strainlab.example' }, workspaces: [strainlab, tidepool] };

describe('workspaceAccess', () => {
  it('uses the workspace named in the address when the user is a member of it', () => {
    expect(workspaceAccess('signed-in', me, 'tidepool', strainlab)).toEqual({ kind: 'member', workspace: tidepool });
  });

  it('says not a member for a workspace the user does not belong to', () => {
    expect(workspaceAccess('signed-in', me, 'elsewhere', strainlab)).toEqual({ kind: 'not-member', slug: 'elsewhere' });
  });

  it('falls back to the current workspace, then the first, without a slug', () => {
    expect(workspaceAccess('signed-in', me, undefined, tidepool)).toEqual({ kind: 'member', workspace: tidepool });
    expect(workspaceAccess('signed-in', me, undefined, undefined)).toEqual({ kind: 'member', workspace: strainlab });
  });

  it('tells apart a newcomer without workspaces, a signed-out visitor, an unreachable server and a pending answer', () => {
    expect(workspaceAccess('signed-in', { ...me, workspaces: [] }, undefined, undefined)).toEqual({ kind: 'no-workspace' });
    expect(workspaceAccess('signed-out', null, 'strainlab', undefined)).toEqual({ kind: 'signed-out' });
    expect(workspaceAccess('offline', null, undefined, undefined)).toEqual({ kind: 'offline' });
    expect(workspaceAccess('unknown', undefined, undefined, undefined)).toEqual({ kind: 'loading' });
  });
});
