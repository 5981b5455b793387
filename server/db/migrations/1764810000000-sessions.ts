import { Table, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Sessions the server can end (sign-out, password change, deactivation), single-use password
 * reset links, and failed sign-ins per account and address for throttling shared by every node.
 */
export class Sessions1764810000000 implements MigrationInterface {
  name = 'Sessions1764810000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'user_session',
        columns: [
          { name: 'id', type: 'varchar', length: '43', isPrimary: true },
          { name: 'user_id', type: 'integer' },
          { name: 'created_at', type: 'varchar', length: '30' },
          { name: 'expires_at', type: 'varchar', length: '30' },
          { name: 'revoked_at', type: 'varchar', length: '30', isNullable: true },
          { name: 'revoked_reason', type: 'varchar', length: '40', isNullable: true },
        ],
        indices: [new TableIndex({ columnNames: ['user_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'password_reset',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'user_id', type: 'integer' },
          { name: 'token_hash', type: 'varchar', length: '64' },
          { name: 'requested_by', type: 'varchar', length: '254' },
          { name: 'created_at', type: 'varchar', length: '30' },
          { name: 'expires_at', type: 'varchar', length: '30' },
          { name: 'used_at', type: 'varchar', length: '30', isNullable: true },
        ],
        indices: [new TableIndex({ columnNames: ['token_hash'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'login_failure',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'email', type: 'varchar', length: '254' },
          { name: 'address', type: 'varchar', length: '64' },
          { name: 'at', type: 'varchar', length: '30' },
        ],
        indices: [new TableIndex({ columnNames: ['email', 'at'] }), new TableIndex({ columnNames: ['address', 'at'] })],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('login_failure');
    await queryRunner.dropTable('password_reset');
    await queryRunner.dropTable('user_session');
  }
}
