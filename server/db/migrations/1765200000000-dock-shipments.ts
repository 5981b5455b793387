import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * The dock board shows one card per shipment: each ship notice keeps its own column, the
 * unshipped rest of a release line keeps its own, and a receipt remembers which shipment it
 * counted. The lines and notices take the column their release had, so no card jumps on upgrade;
 * the release's own column is no longer read (left in place: dropping a column is a table rebuild
 * on SQLite).
 */
export class DockShipments1765200000000 implements MigrationInterface {
  name = 'DockShipments1765200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const column = () => new TableColumn({ name: 'dock_column', type: 'varchar', length: '12', default: "'expected'" });
    await queryRunner.addColumn('ship_notice', column());
    await queryRunner.addColumn('release_line', column());
    await queryRunner.addColumn(
      'receipt',
      new TableColumn({ name: 'ship_notice_id', type: 'integer', isNullable: true }),
    );
    await queryRunner.query(
      'UPDATE release_line SET dock_column = (SELECT r.dock_column FROM "release" r WHERE r.id = release_line.release_id)',
    );
    await queryRunner.query(
      'UPDATE ship_notice SET dock_column = (SELECT r.dock_column FROM "release" r WHERE r.id = ship_notice.release_id)',
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropColumn('receipt', 'ship_notice_id');
    await queryRunner.dropColumn('release_line', 'dock_column');
    await queryRunner.dropColumn('ship_notice', 'dock_column');
  }
}
