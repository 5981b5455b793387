import { Table, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Ship notices: one row per shipment a supplier announces, its lines (release line and quantity),
 * and the reusable link in the confirmation receipt through which a supplier without an account
 * sends them.
 */
export class ShipNotices1765150000000 implements MigrationInterface {
  name = 'ShipNotices1765150000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const id = {
      name: 'id',
      type: 'integer',
      isPrimary: true,
      isGenerated: true,
      generationStrategy: 'increment' as const,
    };
    await queryRunner.createTable(
      new Table({
        name: 'ship_notice',
        columns: [
          id,
          { name: 'release_id', type: 'integer' },
          { name: 'ship_date', type: 'varchar', length: '10' },
          { name: 'arrival_date', type: 'varchar', length: '10' },
          { name: 'carrier', type: 'varchar', length: '60' },
          { name: 'tracking_number', type: 'varchar', length: '60' },
          { name: 'created_at', type: 'varchar', length: '30' },
          { name: 'created_by', type: 'varchar', length: '200' },
        ],
        indices: [new TableIndex({ columnNames: ['release_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'ship_notice_line',
        columns: [
          id,
          { name: 'ship_notice_id', type: 'integer' },
          { name: 'release_line_id', type: 'integer' },
          { name: 'qty', type: 'double precision' },
        ],
        indices: [
          new TableIndex({ columnNames: ['ship_notice_id'] }),
          new TableIndex({ columnNames: ['release_line_id'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'shipping_link',
        columns: [
          id,
          { name: 'release_id', type: 'integer' },
          { name: 'token_hash', type: 'varchar', length: '64' },
          { name: 'expires_at', type: 'varchar', length: '30' },
        ],
        indices: [
          new TableIndex({ columnNames: ['release_id'] }),
          new TableIndex({ columnNames: ['token_hash'], isUnique: true }),
        ],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('shipping_link');
    await queryRunner.dropTable('ship_notice_line');
    await queryRunner.dropTable('ship_notice');
  }
}
