import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export const BLOCK_STATES = ['draft', 'in_review', 'vetted', 'retired'] as const;
/** draft → in_review → vetted → retired; in_review → draft when sent back. */
export type BlockState = (typeof BLOCK_STATES)[number];

/** A check of the block's own fixture as solved in a browser: its line, text and outcome. */
export interface CheckOutcome {
  line: number;
  text: string;
  pass: boolean;
  /** The checked value, when it is a number. */
  value?: number | null;
}

/** A pin or param of the block as its source and doc comments describe it. */
export interface DocumentedName {
  name: string;
  doc: string | null;
  /** A param's default, as written. */
  default?: string | null;
}

/** One numbered version of a block. Its source is frozen from its first submission (trigger). */
@Entity({ name: 'block_versions' })
export class BlockVersion {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'block_id' })
  blockId!: string;

  @Column({ type: 'integer' })
  version!: number;

  @Column({ type: 'text' })
  state!: BlockState;

  @Column({ type: 'text' })
  source!: string;

  @Column({ type: 'jsonb' })
  pins!: DocumentedName[];

  @Column({ type: 'jsonb' })
  params!: DocumentedName[];

  /** The checks as solved in the author's browser at submission. */
  @Column({ type: 'jsonb', nullable: true })
  checks!: CheckOutcome[] | null;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId!: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @Column({ type: 'timestamptz', name: 'submitted_at', nullable: true })
  submittedAt!: Date | null;

  @Column({ type: 'timestamptz', name: 'decided_at', nullable: true })
  decidedAt!: Date | null;

  @Column({ type: 'uuid', name: 'decided_by', nullable: true })
  decidedBy!: string | null;

  @Column({ type: 'timestamptz', name: 'retired_at', nullable: true })
  retiredAt!: Date | null;

  @Column({ type: 'uuid', name: 'retired_by', nullable: true })
  retiredBy!: string | null;
}
