import { Table, TableColumn, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Stock becomes a ledger: every change of on-hand is a movement, and a part's on-hand is their
 * sum (kept on the part too, for planning). Units of the sequence get a status (planned, started,
 * built). Requests that must count once whatever the retries (a build) keep their first answer.
 */
export class StockLedger1764900000000 implements MigrationInterface {
  name = 'StockLedger1764900000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'stock_movement',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'part_number', type: 'varchar', length: '40' },
          { name: 'qty', type: 'double precision' },
          { name: 'kind', type: 'varchar', length: '16' },
          { name: 'at', type: 'varchar', length: '30' },
          { name: 'user_email', type: 'varchar', length: '254', isNullable: true },
          { name: 'reason', type: 'varchar', length: '200', isNullable: true },
          { name: 'ref_type', type: 'varchar', length: '16', isNullable: true },
          { name: 'ref', type: 'varchar', length: '80', isNullable: true },
          { name: 'balance_after', type: 'double precision' },
        ],
        indices: [
          new TableIndex({ columnNames: ['part_number', 'id'] }),
          new TableIndex({ columnNames: ['ref_type', 'ref'] }),
          new TableIndex({ columnNames: ['at'] }),
        ],
      }),
    );
    await queryRunner.addColumn(
      'part',
      new TableColumn({ name: 'last_counted_at', type: 'varchar', length: '30', isNullable: true }),
    );
    await queryRunner.addColumns('sequence_entry', [
      new TableColumn({ name: 'status', type: 'varchar', length: '10', default: "'planned'" }),
      new TableColumn({ name: 'started_at', type: 'varchar', length: '30', isNullable: true }),
      new TableColumn({ name: 'built_at', type: 'varchar', length: '30', isNullable: true }),
    ]);
    await queryRunner.createTable(
      new Table({
        name: 'idempotent_request',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'scope', type: 'varchar', length: '30' },
          { name: 'idempotency_key', type: 'varchar', length: '100' },
          { name: 'request_hash', type: 'varchar', length: '64' },
          { name: 'status', type: 'integer' },
          { name: 'response', type: 'text' },
          { name: 'created_at', type: 'varchar', length: '30' },
        ],
        indices: [new TableIndex({ columnNames: ['scope', 'idempotency_key'], isUnique: true })],
      }),
    );
    // What is on hand today opens each part's ledger, so the sum of movements is the on-hand.
    const now = new Date().toISOString();
    await queryRunner.query(
      `INSERT INTO "stock_movement" ("part_number", "qty", "kind", "at", "user_email", "reason", "ref_type", "ref", "balance_after")
       SELECT "part_number", "on_hand", 'opening', '${now}', NULL, 'On-hand when the stock ledger began', NULL, NULL, "on_hand"
       FROM "part" WHERE "on_hand" <> 0`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('idempotent_request');
    await queryRunner.dropColumns('sequence_entry', ['status', 'started_at', 'built_at']);
    await queryRunner.dropColumn('part', 'last_counted_at');
    await queryRunner.dropTable('stock_movement');
  }
}
