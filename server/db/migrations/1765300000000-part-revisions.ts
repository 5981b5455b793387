import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Every part carries the revision of its last change to what planning reads of it (number,
 * description, unit, source, supplier, replenishment, lead time, pack, on-hand, safety stock,
 * last count, hazardous), so a reader that holds the part master as of one revision reads again
 * only the parts changed since (the line risk, after a part edit on a large plant). Triggers keep
 * it, so no writer can forget to. Revisions only grow, also past a deleted part's: on SQLite they
 * come from a counter row, on PostgreSQL from a sequence.
 */
export class PartRevisions1765300000000 implements MigrationInterface {
  name = 'PartRevisions1765300000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE part ADD COLUMN revision integer NOT NULL DEFAULT 0`);
    await queryRunner.query(`CREATE INDEX "IDX_part_revision" ON part (revision)`);
    const changed = PLANNED_COLUMNS.map((column) => `NEW.${column} IS DISTINCT FROM OLD.${column}`).join(' OR ');
    if (queryRunner.connection.options.type === 'postgres') {
      await queryRunner.query(`CREATE SEQUENCE part_revision_seq`);
      await queryRunner.query(`CREATE FUNCTION part_revised() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN
          IF TG_OP = 'INSERT' OR ${changed} THEN NEW.revision := nextval('part_revision_seq'); END IF;
          RETURN NEW;
        END $$`);
      await queryRunner.query(
        `CREATE TRIGGER part_revised BEFORE INSERT OR UPDATE ON part FOR EACH ROW EXECUTE FUNCTION part_revised()`,
      );
      return;
    }
    await queryRunner.query(`CREATE TABLE part_revision_counter (last integer NOT NULL)`);
    await queryRunner.query(`INSERT INTO part_revision_counter (last) VALUES (0)`);
    // SQLite has no IS DISTINCT FROM; IS NOT is the same test.
    const when = changed.replaceAll('IS DISTINCT FROM', 'IS NOT');
    const revise = `UPDATE part_revision_counter SET last = last + 1;
      UPDATE part SET revision = (SELECT last FROM part_revision_counter) WHERE id = NEW.id;`;
    await queryRunner.query(`CREATE TRIGGER part_revised_insert AFTER INSERT ON part BEGIN ${revise} END`);
    await queryRunner.query(`CREATE TRIGGER part_revised_update AFTER UPDATE ON part WHEN ${when} BEGIN ${revise} END`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    if (queryRunner.connection.options.type === 'postgres') {
      await queryRunner.query(`DROP TRIGGER part_revised ON part`);
      await queryRunner.query(`DROP FUNCTION part_revised()`);
      await queryRunner.query(`DROP SEQUENCE part_revision_seq`);
    } else {
      await queryRunner.query(`DROP TRIGGER part_revised_update`);
      await queryRunner.query(`DROP TRIGGER part_revised_insert`);
      await queryRunner.query(`DROP TABLE part_revision_counter`);
    }
    await queryRunner.query(`DROP INDEX "IDX_part_revision"`);
    await queryRunner.query(`ALTER TABLE part DROP COLUMN revision`);
  }
}

/** The part columns planning reads. */
const PLANNED_COLUMNS = [
  'part_number',
  'description',
  'uom',
  'source',
  'supplier_code',
  'replenishment',
  'lead_time_days',
  'pack_qty',
  'on_hand',
  'safety_stock',
  'last_counted_at',
  'hazardous',
];
