import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A reusable, expiring link for a supplier to send ship notices of one release; only the hash is stored. */
@Entity('shipping_link')
export class ShippingLinkEntity {
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
}
