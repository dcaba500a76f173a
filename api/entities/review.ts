import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export const REVIEW_KINDS = ['submit', 'comment', 'approve', 'send_back'] as const;
export type ReviewKind = (typeof REVIEW_KINDS)[number];

/** One entry of a block version's review thread, optionally tied to a line of its source. */
@Entity({ name: 'reviews' })
export class Review {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'block_version_id' })
  blockVersionId!: string;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId!: string;

  @Column({ type: 'text' })
  kind!: ReviewKind;

  @Column({ type: 'text' })
  comment!: string;

  @Column({ type: 'integer', nullable: true })
  line!: number | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;
}
