import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('kanban_card')
@Index(['loopId', 'cardIndex'], { unique: true })
export class KanbanCardEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'loop_id', type: 'integer' })
  loopId: number;

  /** 1-based position of the card within its loop, printed as "card 3 of 8". */
  @Column({ name: 'card_index', type: 'integer' })
  cardIndex: number;

  /** Numeric card number carrying a GS1 mod-10 check digit. */
  @Index({ unique: true })
  @Column({ name: 'card_number', type: 'varchar', length: 20 })
  cardNumber: string;

  @Column({ type: 'varchar', length: 10, default: 'full' })
  state: string;

  @Column({ name: 'state_changed_at', type: 'varchar', length: 30 })
  stateChangedAt: string;

  /** Set when the card is pulled from circulation; retired cards keep their number and history. */
  @Column({ name: 'retired_at', type: 'varchar', length: 30, nullable: true })
  retiredAt: string | null;

  @Column({ name: 'release_line_id', type: 'integer', nullable: true })
  releaseLineId: number | null;
}
