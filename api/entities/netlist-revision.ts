import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One save of a netlist, never changed afterwards (a trigger refuses UPDATE). */
@Entity({ name: 'netlist_revisions' })
export class NetlistRevision {
  @PrimaryColumn({ type: 'uuid', name: 'netlist_id' })
  netlistId!: string;

  @PrimaryColumn({ type: 'integer' })
  version!: number;

  @Column({ type: 'text' })
  source!: string;

  @Column({ type: 'integer' })
  size!: number;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId!: string;

  @Column({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  /** The version whose text this revision restored, when it was a restore. */
  @Column({ type: 'integer', name: 'restored_from', nullable: true })
  restoredFrom!: number | null;
}
