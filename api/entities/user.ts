import { Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import type { Membership } from './membership';

/** A person who signs in through the identity provider. */
@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'text', unique: true })
  email!: string;

  @Column({ type: 'text', name: 'display_name' })
  displayName!: string;

  /** The identity provider's subject; null until the first sign-in. */
  @Column({ type: 'text', name: 'oidc_subject', unique: true, nullable: true })
  oidcSubject!: string | null;

  @Column({ type: 'timestamptz', name: 'last_sign_in_at', nullable: true })
  lastSignInAt!: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt!: Date;

  @OneToMany('Membership', 'user')
  memberships!: Membership[];
}
