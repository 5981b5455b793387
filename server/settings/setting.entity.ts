import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity('setting')
export class SettingEntity {
  @PrimaryColumn({ type: 'varchar', length: 60 })
  key: string;

  @Column({ type: 'simple-json' })
  value: object | number | string | boolean;
}
