import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

/** What a person handling a part must know: its dangerous-goods identity, its data sheet, its weight. */
export class PartSafety1765100000000 implements MigrationInterface {
  name = 'PartSafety1765100000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('part', [
      new TableColumn({ name: 'un_number', type: 'varchar', length: '6', isNullable: true }),
      new TableColumn({ name: 'hazard_class', type: 'varchar', length: '10', isNullable: true }),
      new TableColumn({ name: 'sds_url', type: 'varchar', length: '500', isNullable: true }),
      new TableColumn({ name: 'unit_weight_kg', type: 'double precision', isNullable: true }),
      new TableColumn({ name: 'heavy_lift', type: 'boolean', default: false }),
    ]);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const column of ['heavy_lift', 'unit_weight_kg', 'sds_url', 'hazard_class', 'un_number']) {
      await queryRunner.dropColumn('part', column);
    }
  }
}
