import { AuditEntry } from './audit-entry';
import { Block } from './block';
import { BlockVersion } from './block-version';
import { Review } from './review';
import { Invitation } from './invitation';
import { Membership } from './membership';
import { Netlist } from './netlist';
import { NetlistRevision } from './netlist-revision';
import { ShareLink } from './share-link';
import { User } from './user';
import { Workspace } from './workspace';

export { AuditEntry, Block, BlockVersion, Invitation, Review, Membership, Netlist, NetlistRevision, ShareLink, User, Workspace };
export { ROLES, roleAtLeast, type Role } from './membership';
export { VISIBILITIES, type Visibility } from './netlist';
export type { LibraryPin } from './share-link';
export { BLOCK_STATES, type BlockState, type CheckOutcome, type DocumentedName } from './block-version';
export { REVIEW_KINDS, type ReviewKind } from './review';

/** Every entity, for the DataSource. */
export const ENTITIES = [User, Workspace, Membership, Netlist, NetlistRevision, Invitation, ShareLink, AuditEntry, Block, BlockVersion, Review];
