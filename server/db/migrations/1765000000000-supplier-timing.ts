import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Supplier terms that hold together: transit from shipping to arrival, the weekdays a supplier
 * delivers, a delivery cycle that may be left empty (derived from the lead time), receiving
 * tolerances. Release lines keep what was first asked (quantity and date) apart from what the
 * supplier answered, are marked when they had to be expedited, and store the arrival the answer
 * implies. Existing stated cycles that contradict their supplier's lead time become derived ones.
 */
export class SupplierTiming1765000000000 implements MigrationInterface {
  name = 'SupplierTiming1765000000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('supplier', [
      new TableColumn({ name: 'transit_days', type: 'integer', default: 0 }),
      new TableColumn({ name: 'delivery_weekdays', type: 'varchar', length: '20', default: "''" }),
      new TableColumn({ name: 'over_tolerance_pct', type: 'double precision', default: 0 }),
      new TableColumn({ name: 'early_tolerance_days', type: 'integer', default: 1 }),
      new TableColumn({ name: 'late_tolerance_days', type: 'integer', default: 0 }),
    ]);
    for (const name of ['cycle_days', 'deliveries_per_cycle', 'delivery_delay']) {
      await queryRunner.changeColumn(
        'supplier',
        name,
        new TableColumn({ name, type: 'integer', isNullable: true, default: null }),
      );
    }
    // A delay of d deliveries brings goods back d × days / deliveries working days later: shorter
    // than the lead time is impossible, so such a cycle is dropped and derived instead.
    await queryRunner.query(
      `UPDATE supplier SET cycle_days = NULL, deliveries_per_cycle = NULL, delivery_delay = NULL
       WHERE delivery_delay * cycle_days < lead_time_days * deliveries_per_cycle`,
    );

    await queryRunner.addColumns('release_line', [
      new TableColumn({ name: 'requested_qty', type: 'double precision', isNullable: true }),
      new TableColumn({ name: 'requested_date', type: 'varchar', length: '10', isNullable: true }),
      new TableColumn({ name: 'expedite', type: 'boolean', default: false }),
      new TableColumn({ name: 'arrival_date', type: 'varchar', length: '10', isNullable: true }),
    ]);
    // Until now a ship date was taken for the arrival: keep that reading for lines already answered.
    await queryRunner.query(
      'UPDATE release_line SET requested_qty = qty, requested_date = need_date, arrival_date = ship_date',
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const name of ['requested_qty', 'requested_date', 'expedite', 'arrival_date']) {
      await queryRunner.dropColumn('release_line', name);
    }
    await queryRunner.query(
      'UPDATE supplier SET cycle_days = 1, deliveries_per_cycle = 1, delivery_delay = 1 WHERE cycle_days IS NULL',
    );
    for (const name of ['cycle_days', 'deliveries_per_cycle', 'delivery_delay']) {
      await queryRunner.changeColumn('supplier', name, new TableColumn({ name, type: 'integer', default: 1 }));
    }
    for (const name of [
      'transit_days',
      'delivery_weekdays',
      'over_tolerance_pct',
      'early_tolerance_days',
      'late_tolerance_days',
    ]) {
      await queryRunner.dropColumn('supplier', name);
    }
  }
}
