import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('card_scan')
export class CardScanEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Index()
  @Column({ name: 'card_id', type: 'integer' })
  cardId: number;

  @Column({ type: 'varchar', length: 10 })
  event: string;

  @Column({ name: 'from_state', type: 'varchar', length: 10 })
  fromState: string;

  @Column({ name: 'to_state', type: 'varchar', length: 10 })
  toState: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254, nullable: true })
  userEmail: string | null;

  @Column({ name: 'scanned_at', type: 'varchar', length: 30 })
  scannedAt: string;
}
