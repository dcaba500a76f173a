import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export const VISIBILITIES = ['private', 'workspace'] as const;
/** `private`: its owner only; `workspace`: every member of its workspace. */
export type Visibility = (typeof VISIBILITIES)[number];

/** A team netlist: its current text and version; every version is kept in `netlist_revisions`. */
@Entity({ name: 'netlists' })
export class Netlist {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string;

  @Column({ type: 'uuid', name: 'owner_id' })
  ownerId!: string;

  @Column({ type: 'text' })
  name!: string;

  @Column({ type: 'text' })
  visibility!: Visibility;

  /** Optimistic concurrency: a save must name the version it started from. */
  @Column({ type: 'integer' })
  version!: number;

  /** The current text (the newest revision's), kept here for listing and reading in one row. */
  @Column({ type: 'text' })
  source!: string;

  /** UTF-8 bytes of `source`. */
  @Column({ type: 'integer' })
  size!: number;

  @Column({ type: 'uuid', name: 'updated_by' })
  updatedBy!: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @Column({ type: 'timestamptz', name: 'updated_at' })
  updatedAt!: Date;

  /** Soft delete: restorable for 30 days. */
  @Column({ type: 'timestamptz', name: 'deleted_at', nullable: true })
  deletedAt!: Date | null;

  @Column({ type: 'uuid', name: 'deleted_by', nullable: true })
  deletedBy!: string | null;
}
