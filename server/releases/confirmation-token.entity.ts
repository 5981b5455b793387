import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A single-use, expiring link for a supplier to confirm a release; only the hash is stored. */
@Entity('confirmation_token')
export class ConfirmationTokenEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'release_id', type: 'integer' })
  releaseId: number;

  @Index({ unique: true })
  @Column({ name: 'token_hash', type: 'varchar', length: 64 })
  tokenHash: string;

  @Column({ name: 'expires_at', type: 'varchar', length: 30 })
  expiresAt: string;

  @Column({ name: 'used_at', type: 'varchar', length: 30, nullable: true })
  usedAt: string | null;
}
