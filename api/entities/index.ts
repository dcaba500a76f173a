import { AuditEntry } from './audit-entry';
import { Invitation } from './invitation';
import { Membership } from './membership';
import { Netlist } from './netlist';
import { NetlistRevision } from './netlist-revision';
import { ShareLink } from './share-link';
import { User } from './user';
import { Workspace } from './workspace';

export { AuditEntry, Invitation, Membership, Netlist, NetlistRevision, ShareLink, User, Workspace };
export { ROLES, roleAtLeast, type Role } from './membership';
export { VISIBILITIES, type Visibility } from './netlist';
export type { LibraryPin } from './share-link';

/** Every entity, for the DataSource. */
export const ENTITIES = [User, Workspace, Membership, Netlist, NetlistRevision, Invitation, ShareLink, AuditEntry];
