import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A non-working date of the plant calendar; working weekdays live in settings. */
@Entity('plant_holiday')
export class HolidayEntity {
  @PrimaryColumn({ type: 'varchar', length: 10 })
  date: string;

  @Column({ type: 'varchar', length: 80, default: '' })
  name: string;
}
