import { Membership } from './membership';
import { User } from './user';
import { Workspace } from './workspace';

export { Membership, User, Workspace };
export { ROLES, roleAtLeast, type Role } from './membership';

/** Every entity, for the DataSource. */
export const ENTITIES = [User, Workspace, Membership];
