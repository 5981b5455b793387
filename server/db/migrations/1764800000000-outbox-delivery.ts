import { TableColumn, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Notices are never given up: a message that keeps failing stays `failing` and is retried. Each
 * notice names what it is about (`ref`), so a release can show its own mail; a claim lets one
 * dispatcher at a time send it.
 */
export class OutboxDelivery1764800000000 implements MigrationInterface {
  name = 'OutboxDelivery1764800000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('outbox_message', [
      new TableColumn({ name: 'ref', type: 'varchar', length: '80', isNullable: true }),
      new TableColumn({ name: 'first_failed_at', type: 'varchar', length: '30', isNullable: true }),
      new TableColumn({ name: 'claimed_until', type: 'varchar', length: '30', isNullable: true }),
    ]);
    await queryRunner.createIndex('outbox_message', new TableIndex({ columnNames: ['ref'] }));
    await queryRunner.query(`UPDATE "outbox_message" SET "status" = 'failing' WHERE "status" = 'failed'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`UPDATE "outbox_message" SET "status" = 'failed' WHERE "status" = 'failing'`);
    const table = await queryRunner.getTable('outbox_message');
    const index = table?.indices.find((candidate) => candidate.columnNames.join() === 'ref');
    if (index) await queryRunner.dropIndex('outbox_message', index);
    await queryRunner.dropColumns('outbox_message', ['ref', 'first_failed_at', 'claimed_until']);
  }
}
