import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Every part, BOM line and unit of the sequence carries the revision of its last change to what
 * planning reads of it, so a reader that holds the part master, the BOM or the units to build as of
 * one revision reads again only the rows changed since (the line risk, after an edit on a large
 * plant). Triggers keep it, so no
 * writer can forget to. Revisions only grow, also past a deleted row's: on SQLite they come from a
 * counter row, on PostgreSQL from a sequence.
 */
export class PlanningRevisions1765300000000 implements MigrationInterface {
  name = 'PlanningRevisions1765300000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const postgres = queryRunner.connection.options.type === 'postgres';
    if (postgres) await queryRunner.query(`CREATE SEQUENCE planning_revision_seq`);
    else {
      await queryRunner.query(`CREATE TABLE planning_revision_counter (last integer NOT NULL)`);
      await queryRunner.query(`INSERT INTO planning_revision_counter (last) VALUES (0)`);
    }
    for (const [table, columns] of Object.entries(PLANNED_COLUMNS)) {
      await queryRunner.query(`ALTER TABLE ${table} ADD COLUMN revision integer NOT NULL DEFAULT 0`);
      await queryRunner.query(`CREATE INDEX "IDX_${table}_revision" ON ${table} (revision)`);
      const changed = columns.map((column) => `NEW.${column} IS DISTINCT FROM OLD.${column}`).join(' OR ');
      if (postgres) {
        await queryRunner.query(`CREATE FUNCTION ${table}_revised() RETURNS trigger LANGUAGE plpgsql AS $$
          BEGIN
            IF TG_OP = 'INSERT' OR ${changed} THEN NEW.revision := nextval('planning_revision_seq'); END IF;
            RETURN NEW;
          END $$`);
        await queryRunner.query(
          `CREATE TRIGGER ${table}_revised BEFORE INSERT OR UPDATE ON ${table} FOR EACH ROW EXECUTE FUNCTION ${table}_revised()`,
        );
        continue;
      }
      // SQLite has no IS DISTINCT FROM; IS NOT is the same test.
      const when = changed.replaceAll('IS DISTINCT FROM', 'IS NOT');
      const revise = `UPDATE planning_revision_counter SET last = last + 1;
        UPDATE ${table} SET revision = (SELECT last FROM planning_revision_counter) WHERE id = NEW.id;`;
      await queryRunner.query(`CREATE TRIGGER ${table}_revised_insert AFTER INSERT ON ${table} BEGIN ${revise} END`);
      await queryRunner.query(
        `CREATE TRIGGER ${table}_revised_update AFTER UPDATE ON ${table} WHEN ${when} BEGIN ${revise} END`,
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    const postgres = queryRunner.connection.options.type === 'postgres';
    for (const table of Object.keys(PLANNED_COLUMNS)) {
      if (postgres) {
        await queryRunner.query(`DROP TRIGGER ${table}_revised ON ${table}`);
        await queryRunner.query(`DROP FUNCTION ${table}_revised()`);
      } else {
        await queryRunner.query(`DROP TRIGGER ${table}_revised_update`);
        await queryRunner.query(`DROP TRIGGER ${table}_revised_insert`);
      }
      await queryRunner.query(`DROP INDEX "IDX_${table}_revision"`);
      await queryRunner.query(`ALTER TABLE ${table} DROP COLUMN revision`);
    }
    await queryRunner.query(postgres ? `DROP SEQUENCE planning_revision_seq` : `DROP TABLE planning_revision_counter`);
  }
}

/** The columns planning reads, by table. */
const PLANNED_COLUMNS: Record<string, string[]> = {
  part: [
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
  ],
  bom_line: ['parent', 'component', 'qty_per', 'scrap_pct', 'effective_from', 'effective_to'],
  sequence_entry: ['date', 'sequence', 'model', 'serial', 'qty', 'status'],
};
