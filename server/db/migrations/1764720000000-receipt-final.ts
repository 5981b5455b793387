import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Whether the clerk marked a receipt final (closing its line short), so a replayed request can be compared in full. */
export class ReceiptFinal1764720000000 implements MigrationInterface {
  name = 'ReceiptFinal1764720000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE "receipt" ADD COLUMN "final" boolean NOT NULL DEFAULT (0)');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE "receipt" DROP COLUMN "final"');
  }
}
