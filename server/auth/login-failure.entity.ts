import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One failed sign-in, counted per account and per client address for throttling. */
@Entity('login_failure')
@Index(['email', 'at'])
@Index(['address', 'at'])
export class LoginFailureEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 254 })
  email: string;

  @Column({ type: 'varchar', length: 64 })
  address: string;

  @Column({ type: 'varchar', length: 30 })
  at: string;
}
