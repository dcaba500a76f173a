import type { Role } from '../core/team-api';

/** The roles an admin can give, weakest first, with the words shown in selects. */
export const ROLE_CHOICES: readonly { value: Role; label: string }[] = [
  { value: 'viewer', label: 'Viewer' },
  { value: 'designer', label: 'Designer' },
  { value: 'reviewer', label: 'Reviewer' },
  { value: 'admin', label: 'Admin' },
];
