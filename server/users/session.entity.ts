import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** One sign-in: its token names this row, so the server can end it before the token expires. */
@Entity('user_session')
export class SessionEntity {
  /** Random, URL-safe; carried in the token as `sid`. */
  @PrimaryColumn({ type: 'varchar', length: 43 })
  id: string;

  @Index()
  @Column({ name: 'user_id', type: 'integer' })
  userId: number;

  @Column({ name: 'created_at', type: 'varchar', length: 30 })
  createdAt: string;

  @Column({ name: 'expires_at', type: 'varchar', length: 30 })
  expiresAt: string;

  @Column({ name: 'revoked_at', type: 'varchar', length: 30, nullable: true })
  revokedAt: string | null;

  /** sign-out, password-changed, password-reset, deactivated, role-changed */
  @Column({ name: 'revoked_reason', type: 'varchar', length: 40, nullable: true })
  revokedReason: string | null;
}
