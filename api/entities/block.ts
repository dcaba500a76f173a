import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A library block of one workspace: a path (`category/name`), what it is, and its versions. */
@Entity({ name: 'blocks' })
export class Block {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId!: string;

  /** `category/name`, e.g. `mirrors/wilson_npn`; the block's name in a netlist is the last part. */
  @Column({ type: 'text' })
  path!: string;

  /** The first part of the path (a generated column). */
  @Column({ type: 'text', insert: false, update: false })
  category!: string;

  @Column({ type: 'text' })
  title!: string;

  @Column({ type: 'text' })
  summary!: string;

  @Column({ type: 'text', array: true })
  tags!: string[];

  @Column({ type: 'uuid', name: 'created_by' })
  createdBy!: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;
}
