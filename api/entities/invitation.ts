import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from './membership';

/** An invitation to a workspace, mailed as a single-use link; only the token's hash is kept. */
@Entity({ name: 'invitations' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string;

  /** Lower case; sign-in must be with this address to accept. */
  @Column({ type: 'text' })
  email!: string;

  @Column({ type: 'text' })
  role!: Role;

  @Column({ type: 'text', name: 'token_hash' })
  tokenHash!: string;

  @Column({ type: 'uuid', name: 'invited_by' })
  invitedBy!: string;

  @Column({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @Column({ type: 'timestamptz', name: 'expires_at' })
  expiresAt!: Date;

  @Column({ type: 'timestamptz', name: 'accepted_at', nullable: true })
  acceptedAt!: Date | null;

  @Column({ type: 'uuid', name: 'accepted_by', nullable: true })
  acceptedBy!: string | null;

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt!: Date | null;
}
