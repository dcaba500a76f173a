import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm';
import type { User } from './user';
import type { Workspace } from './workspace';

/** Roles, weakest first: viewer reads; designer writes netlists and proposes blocks;
 *  reviewer vets or sends back blocks; admin manages members. */
export const ROLES = ['viewer', 'designer', 'reviewer', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Whether `role` grants at least what `needed` grants. */
export function roleAtLeast(role: Role, needed: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(needed);
}

/** A user's role in one workspace. */
@Entity({ name: 'memberships' })
@Unique('uq_memberships_user_workspace', ['userId', 'workspaceId'])
export class Membership {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'user_id' })
  userId!: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string;

  @Column({ type: 'text' })
  role!: Role;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @ManyToOne('User', 'memberships', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user!: User;

  @ManyToOne('Workspace', 'memberships', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id' })
  workspace!: Workspace;
}
