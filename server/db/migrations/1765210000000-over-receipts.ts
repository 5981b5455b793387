import { Table, TableColumn, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Over-receipts: a receipt over the supplier's tolerance keeps the clerk's choice (keep or return)
 * and its excess over the ordered quantity; kept excess applied to other open lines is recorded
 * per line, so a replay answers the same and the scorecard sees where the goods went.
 */
export class OverReceipts1765210000000 implements MigrationInterface {
  name = 'OverReceipts1765210000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('receipt', [
      new TableColumn({ name: 'over_action', type: 'varchar', length: '8', isNullable: true }),
      new TableColumn({ name: 'excess_qty', type: 'double precision', default: 0 }),
    ]);
    await queryRunner.createTable(
      new Table({
        name: 'receipt_share',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'receipt_id', type: 'integer' },
          { name: 'release_line_id', type: 'integer' },
          { name: 'qty', type: 'double precision' },
          { name: 'due', type: 'varchar', length: '10' },
          { name: 'closed', type: 'boolean', default: false },
        ],
        indices: [
          new TableIndex({ columnNames: ['receipt_id'] }),
          new TableIndex({ columnNames: ['release_line_id'] }),
        ],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('receipt_share');
    await queryRunner.dropColumn('receipt', 'excess_qty');
    await queryRunner.dropColumn('receipt', 'over_action');
  }
}
