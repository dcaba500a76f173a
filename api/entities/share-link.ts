import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A library block version a netlist used, as resolved in the author's bench. */
export interface LibraryPin {
  path: string;
  version: number;
}

/** A read-only link to one revision of a netlist; only the token's SHA-256 is kept. */
@Entity({ name: 'share_links' })
export class ShareLink {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'uuid', name: 'netlist_id' })
  netlistId!: string;

  /** The revision the link shows, whatever is saved later. */
  @Column({ type: 'integer' })
  version!: number;

  @Column({ type: 'text', name: 'token_hash' })
  tokenHash!: string;

  @Column({ type: 'uuid', name: 'created_by' })
  createdBy!: string;

  @Column({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @Column({ type: 'timestamptz', name: 'expires_at', nullable: true })
  expiresAt!: Date | null;

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt!: Date | null;

  @Column({ type: 'jsonb', name: 'library_pins' })
  libraryPins!: LibraryPin[];
}
