import { TableColumn, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

const OLD_UNIQUE = 'IDX_3e6ee55bd44b50ffe533bac085';
const NEW_UNIQUE = 'IDX_release_supplier_date_reference';

/**
 * Orders already open with a supplier when the plant starts with Cardloop are loaded as releases of
 * their own, one per supplier and order reference. The daily release keeps an empty reference, so
 * it stays one per supplier and day.
 */
export class OpenOrders1765050000000 implements MigrationInterface {
  name = 'OpenOrders1765050000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn(
      'release',
      new TableColumn({ name: 'reference', type: 'varchar', length: '40', default: "''" }),
    );
    await queryRunner.dropIndex('release', OLD_UNIQUE);
    await queryRunner.createIndex(
      'release',
      new TableIndex({ name: NEW_UNIQUE, columnNames: ['supplier_code', 'release_date', 'reference'], isUnique: true }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropIndex('release', NEW_UNIQUE);
    await queryRunner.dropColumn('release', 'reference');
    await queryRunner.createIndex(
      'release',
      new TableIndex({ name: OLD_UNIQUE, columnNames: ['supplier_code', 'release_date'], isUnique: true }),
    );
  }
}
