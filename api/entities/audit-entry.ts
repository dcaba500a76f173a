import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One write: who did what to which item, when. Append-only (a trigger refuses UPDATE). */
@Entity({ name: 'audit_log' })
export class AuditEntry {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id!: string;

  @Column({ type: 'timestamptz' })
  at!: Date;

  @Column({ type: 'uuid', name: 'workspace_id', nullable: true })
  workspaceId!: string | null;

  @Column({ type: 'uuid', name: 'actor_id', nullable: true })
  actorId!: string | null;

  /** `noun.verb`, e.g. `netlist.save`, `member.role_change`. */
  @Column({ type: 'text' })
  action!: string;

  @Column({ type: 'text', name: 'target_type' })
  targetType!: string;

  @Column({ type: 'text', name: 'target_id', nullable: true })
  targetId!: string | null;

  @Column({ type: 'jsonb', nullable: true })
  details!: Record<string, unknown> | null;
}
