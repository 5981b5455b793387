import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Planning changes are counted per piece (parts, BOM, sequence, calendar) rather than as one
 * structure version: the old counter's row goes. The new counters need no rows yet: each is
 * written by the first change to its piece, and the line risk reads everything once after a start.
 */
export class PlanningPieces1765260000000 implements MigrationInterface {
  name = 'PlanningPieces1765260000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DELETE FROM setting WHERE "key" = 'planningVersion.structure'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `DELETE FROM setting WHERE "key" IN ('planningVersion.parts', 'planningVersion.bom', 'planningVersion.sequence',
        'planningVersion.calendar', 'planningVersion.structure')`,
    );
    // As if everything but stock changed at the last planning change: always safe for the old reader.
    await queryRunner.query(
      `INSERT INTO setting ("key", value) SELECT 'planningVersion.structure', value FROM setting WHERE "key" = 'planningVersion'`,
    );
  }
}
