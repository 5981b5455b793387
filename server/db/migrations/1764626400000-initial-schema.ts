import { Table, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * The whole first schema: master data, sequence, calendar, kanban, releases, receiving, mail, audit.
 * Written with the Table API so each engine gets its own DDL (SQLite's AUTOINCREMENT, PostgreSQL's
 * sequences) from this one description; on SQLite it makes the same tables and indexes as the raw
 * SQL it replaced, so databases migrated before are unaffected.
 */
export class InitialSchema1764626400000 implements MigrationInterface {
  name = 'InitialSchema1764626400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    // The type and default the engine gives a creation timestamp (SQLite: datetime('now'), PostgreSQL: now()).
    const createDateType = queryRunner.connection.driver.mappedDataTypes.createDate as string;
    const createDateDefault = queryRunner.connection.driver.mappedDataTypes.createDateDefault;
    await queryRunner.createTable(
      new Table({
        name: 'audit_event',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'at', type: 'varchar', length: '30' },
          { name: 'actor_email', type: 'varchar', length: '254', isNullable: true },
          { name: 'action', type: 'varchar', length: '30' },
          { name: 'entity', type: 'varchar', length: '40' },
          { name: 'entity_key', type: 'varchar', length: '80' },
          { name: 'changes', type: 'text', isNullable: true },
        ],
        indices: [new TableIndex({ name: 'IDX_4cf52b7d3b370111cfe3ab0efe', columnNames: ['entity', 'entity_key'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'bom_line',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'parent', type: 'varchar', length: '40' },
          { name: 'component', type: 'varchar', length: '40' },
          { name: 'qty_per', type: 'double precision' },
          { name: 'scrap_pct', type: 'double precision', default: 0 },
          { name: 'effective_from', type: 'varchar', length: '10', isNullable: true },
          { name: 'effective_to', type: 'varchar', length: '10', isNullable: true },
        ],
        indices: [
          new TableIndex({ name: 'IDX_bbb5c56a8048760cf098b878e4', columnNames: ['parent'] }),
          new TableIndex({
            name: 'IDX_feae85fe2d4a2103c9ab395f56',
            columnNames: ['parent', 'component', 'effective_from'],
            isUnique: true,
          }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'plant_holiday',
        columns: [
          { name: 'date', type: 'varchar', length: '10', isPrimary: true },
          { name: 'name', type: 'varchar', length: '80', default: "''" },
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'confirmation_token',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'release_id', type: 'integer' },
          { name: 'token_hash', type: 'varchar', length: '64' },
          { name: 'expires_at', type: 'varchar', length: '30' },
          { name: 'used_at', type: 'varchar', length: '30', isNullable: true },
        ],
        indices: [
          new TableIndex({ name: 'IDX_731b377c510eb07390927e3977', columnNames: ['release_id'] }),
          new TableIndex({ name: 'IDX_9d0bd0030fcbb63f0cb008c22c', columnNames: ['token_hash'], isUnique: true }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'card_scan',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'card_id', type: 'integer' },
          { name: 'event', type: 'varchar', length: '10' },
          { name: 'from_state', type: 'varchar', length: '10' },
          { name: 'to_state', type: 'varchar', length: '10' },
          { name: 'user_email', type: 'varchar', length: '254', isNullable: true },
          { name: 'scanned_at', type: 'varchar', length: '30' },
        ],
        indices: [new TableIndex({ name: 'IDX_968af45fcf22487d7252fac9e0', columnNames: ['card_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'kanban_card',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'loop_id', type: 'integer' },
          { name: 'card_index', type: 'integer' },
          { name: 'card_number', type: 'varchar', length: '20' },
          { name: 'state', type: 'varchar', length: '10', default: "'full'" },
          { name: 'state_changed_at', type: 'varchar', length: '30' },
          { name: 'retired_at', type: 'varchar', length: '30', isNullable: true },
          { name: 'release_line_id', type: 'integer', isNullable: true },
        ],
        indices: [
          new TableIndex({ name: 'IDX_a2b5a55fcd5f3feb5e4cf3768b', columnNames: ['card_number'], isUnique: true }),
          new TableIndex({
            name: 'IDX_4f11cd6bbf653c6a3c7d630745',
            columnNames: ['loop_id', 'card_index'],
            isUnique: true,
          }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'kanban_loop',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'part_number', type: 'varchar', length: '40' },
          { name: 'kind', type: 'varchar', length: '12', default: "'supplier'" },
          { name: 'container_qty', type: 'double precision' },
          { name: 'safety_factor', type: 'double precision', default: 0 },
          { name: 'safety_days', type: 'double precision', default: 0 },
          { name: 'safety_units', type: 'double precision', default: 0 },
          { name: 'sizing_window_days', type: 'integer', default: 20 },
        ],
        indices: [
          new TableIndex({ name: 'IDX_ce4f4970e46db3c9ffdaca0326', columnNames: ['part_number'], isUnique: true }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'outbox_message',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'to_address', type: 'varchar', length: '254' },
          { name: 'subject', type: 'varchar', length: '250' },
          { name: 'text', type: 'text' },
          { name: 'html', type: 'text', isNullable: true },
          { name: 'attachments', type: 'text', isNullable: true },
          { name: 'status', type: 'varchar', length: '10', default: "'pending'" },
          { name: 'attempts', type: 'integer', default: 0 },
          { name: 'next_attempt_at', type: 'varchar', length: '30' },
          { name: 'last_error', type: 'text', isNullable: true },
          { name: 'created_at', type: 'varchar', length: '30' },
          { name: 'sent_at', type: 'varchar', length: '30', isNullable: true },
        ],
        indices: [
          new TableIndex({ name: 'IDX_3e1d188faf16b1e79c1c4ef3e1', columnNames: ['status', 'next_attempt_at'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'part',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'part_number', type: 'varchar', length: '40' },
          { name: 'description', type: 'varchar', length: '200' },
          { name: 'uom', type: 'varchar', length: '3', default: "'H87'" },
          { name: 'source', type: 'varchar', length: '10' },
          { name: 'supplier_code', type: 'varchar', length: '20', isNullable: true },
          { name: 'lead_time_days', type: 'integer', default: 0 },
          { name: 'pack_qty', type: 'double precision', default: 1 },
          { name: 'on_hand', type: 'double precision', default: 0 },
          { name: 'replenishment', type: 'varchar', length: '10', isNullable: true },
          { name: 'safety_stock', type: 'double precision', default: 0 },
          { name: 'point_of_use', type: 'varchar', length: '40', isNullable: true },
          { name: 'hazardous', type: 'boolean', default: false },
        ],
        indices: [
          new TableIndex({ name: 'IDX_db89cbe876fb4aebe0f563683b', columnNames: ['part_number'], isUnique: true }),
          new TableIndex({ name: 'IDX_e05f219539ad60724813a96ea1', columnNames: ['supplier_code'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'attachment',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'release_id', type: 'integer' },
          { name: 'receipt_id', type: 'integer', isNullable: true },
          { name: 'file_name', type: 'varchar', length: '200' },
          { name: 'mime_type', type: 'varchar', length: '100' },
          { name: 'size_bytes', type: 'integer' },
          { name: 'storage_path', type: 'varchar', length: '300' },
          { name: 'uploaded_by', type: 'varchar', length: '254' },
          { name: 'uploaded_at', type: 'varchar', length: '30' },
        ],
        indices: [new TableIndex({ name: 'IDX_60ed56abac5617c65762442ec9', columnNames: ['release_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'receipt',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'release_line_id', type: 'integer' },
          { name: 'qty', type: 'double precision' },
          { name: 'discrepancy', type: 'varchar', length: '12', isNullable: true },
          { name: 'note', type: 'text', isNullable: true },
          { name: 'idempotency_key', type: 'varchar', length: '100' },
          { name: 'on_hand_after', type: 'double precision' },
          { name: 'user_email', type: 'varchar', length: '254' },
          { name: 'received_at', type: 'varchar', length: '30' },
        ],
        indices: [
          new TableIndex({ name: 'IDX_3475bdc1138b1755bb88399c75', columnNames: ['release_line_id'] }),
          new TableIndex({ name: 'IDX_bb0c03014ad0373feeaa268770', columnNames: ['idempotency_key'], isUnique: true }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'release_line',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'release_id', type: 'integer' },
          { name: 'part_number', type: 'varchar', length: '40' },
          { name: 'qty', type: 'double precision' },
          { name: 'need_date', type: 'varchar', length: '10' },
          { name: 'origin', type: 'varchar', length: '10' },
          { name: 'card_id', type: 'integer', isNullable: true },
          { name: 'confirmed_qty', type: 'double precision', isNullable: true },
          { name: 'ship_date', type: 'varchar', length: '10', isNullable: true },
          { name: 'received_qty', type: 'double precision', default: 0 },
          { name: 'closed', type: 'boolean', default: false },
        ],
        indices: [
          new TableIndex({ name: 'IDX_f042f1a9c0e300eca953c6dcfd', columnNames: ['release_id'] }),
          new TableIndex({ name: 'IDX_6634ee8a6522847e989b69fc87', columnNames: ['part_number'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'release',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'number', type: 'varchar', length: '30' },
          { name: 'supplier_code', type: 'varchar', length: '20' },
          { name: 'release_date', type: 'varchar', length: '10' },
          { name: 'status', type: 'varchar', length: '12', default: "'draft'" },
          { name: 'sent_at', type: 'varchar', length: '30', isNullable: true },
          { name: 'confirmed_at', type: 'varchar', length: '30', isNullable: true },
          { name: 'carrier', type: 'varchar', length: '60', isNullable: true },
          { name: 'tracking_number', type: 'varchar', length: '60', isNullable: true },
          { name: 'supplier_note', type: 'text', isNullable: true },
          { name: 'dock_column', type: 'varchar', length: '12', default: "'expected'" },
        ],
        indices: [
          new TableIndex({ name: 'IDX_f19642ecab2a425967958e4392', columnNames: ['number'], isUnique: true }),
          new TableIndex({
            name: 'IDX_3e6ee55bd44b50ffe533bac085',
            columnNames: ['supplier_code', 'release_date'],
            isUnique: true,
          }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'sequence_entry',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'date', type: 'varchar', length: '10' },
          { name: 'sequence', type: 'integer' },
          { name: 'model', type: 'varchar', length: '40' },
          { name: 'serial', type: 'varchar', length: '40' },
          { name: 'qty', type: 'integer', default: 1 },
        ],
        indices: [
          new TableIndex({ name: 'IDX_90277ae1cd6dc2bd36e11fb82c', columnNames: ['serial'], isUnique: true }),
          new TableIndex({ name: 'IDX_2d11d24aa72677db332813889b', columnNames: ['date', 'sequence'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'setting',
        columns: [
          { name: 'key', type: 'varchar', length: '60', isPrimary: true },
          { name: 'value', type: 'text' },
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'supplier',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'code', type: 'varchar', length: '20' },
          { name: 'name', type: 'varchar', length: '120' },
          { name: 'email', type: 'varchar', length: '254' },
          { name: 'lead_time_days', type: 'integer', default: 0 },
          { name: 'cycle_days', type: 'integer', default: 1 },
          { name: 'deliveries_per_cycle', type: 'integer', default: 1 },
          { name: 'delivery_delay', type: 'integer', default: 1 },
        ],
        indices: [new TableIndex({ name: 'IDX_e1183babf2fed1bb440905b1e5', columnNames: ['code'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'user',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'email', type: 'varchar', length: '254' },
          { name: 'name', type: 'varchar', length: '120' },
          { name: 'role', type: 'varchar', length: '20' },
          { name: 'password_hash', type: 'varchar', length: '255' },
          { name: 'supplier_code', type: 'varchar', length: '20', isNullable: true },
          { name: 'active', type: 'boolean', default: true },
          { name: 'created_at', type: createDateType, default: createDateDefault },
        ],
        indices: [new TableIndex({ name: 'IDX_e12875dfb3b1d92d7d7c5377e2', columnNames: ['email'], isUnique: true })],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('user');
    await queryRunner.dropTable('supplier');
    await queryRunner.dropTable('setting');
    await queryRunner.dropTable('sequence_entry');
    await queryRunner.dropTable('release');
    await queryRunner.dropTable('release_line');
    await queryRunner.dropTable('receipt');
    await queryRunner.dropTable('attachment');
    await queryRunner.dropTable('part');
    await queryRunner.dropTable('outbox_message');
    await queryRunner.dropTable('kanban_loop');
    await queryRunner.dropTable('kanban_card');
    await queryRunner.dropTable('card_scan');
    await queryRunner.dropTable('confirmation_token');
    await queryRunner.dropTable('plant_holiday');
    await queryRunner.dropTable('bom_line');
    await queryRunner.dropTable('audit_event');
  }
}
