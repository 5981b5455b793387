import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A single-use link an admin had e-mailed to a user to set a new password; only its hash is kept. */
@Entity('password_reset')
export class PasswordResetEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'user_id', type: 'integer' })
  userId: number;

  @Index({ unique: true })
  @Column({ name: 'token_hash', type: 'varchar', length: 64 })
  tokenHash: string;

  @Column({ name: 'requested_by', type: 'varchar', length: 254 })
  requestedBy: string;

  @Column({ name: 'created_at', type: 'varchar', length: 30 })
  createdAt: string;

  @Column({ name: 'expires_at', type: 'varchar', length: 30 })
  expiresAt: string;

  @Column({ name: 'used_at', type: 'varchar', length: 30, nullable: true })
  usedAt: string | null;
}
