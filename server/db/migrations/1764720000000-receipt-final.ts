import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

/** Whether the clerk marked a receipt final (closing its line short), so a replayed request can be compared in full. */
export class ReceiptFinal1764720000000 implements MigrationInterface {
  name = 'ReceiptFinal1764720000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('receipt', new TableColumn({ name: 'final', type: 'boolean', default: false }));
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropColumn('receipt', 'final');
  }
}
