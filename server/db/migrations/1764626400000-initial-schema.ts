import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The whole first schema: master data, sequence, calendar, kanban, releases, receiving, mail, audit. */
export class InitialSchema1764626400000 implements MigrationInterface {
  name = 'InitialSchema1764626400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE "audit_event" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "at" varchar(30) NOT NULL, "actor_email" varchar(254), "action" varchar(30) NOT NULL, "entity" varchar(40) NOT NULL, "entity_key" varchar(80) NOT NULL, "changes" text)',
    );
    await queryRunner.query('CREATE INDEX "IDX_4cf52b7d3b370111cfe3ab0efe" ON "audit_event" ("entity", "entity_key") ');
    await queryRunner.query(
      'CREATE TABLE "bom_line" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "parent" varchar(40) NOT NULL, "component" varchar(40) NOT NULL, "qty_per" double precision NOT NULL, "scrap_pct" double precision NOT NULL DEFAULT (0), "effective_from" varchar(10), "effective_to" varchar(10))',
    );
    await queryRunner.query('CREATE INDEX "IDX_bbb5c56a8048760cf098b878e4" ON "bom_line" ("parent") ');
    await queryRunner.query(
      'CREATE UNIQUE INDEX "IDX_feae85fe2d4a2103c9ab395f56" ON "bom_line" ("parent", "component", "effective_from") ',
    );
    await queryRunner.query(
      'CREATE TABLE "plant_holiday" ("date" varchar(10) PRIMARY KEY NOT NULL, "name" varchar(80) NOT NULL DEFAULT (\'\'))',
    );
    await queryRunner.query(
      'CREATE TABLE "confirmation_token" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "release_id" integer NOT NULL, "token_hash" varchar(64) NOT NULL, "expires_at" varchar(30) NOT NULL, "used_at" varchar(30))',
    );
    await queryRunner.query('CREATE INDEX "IDX_731b377c510eb07390927e3977" ON "confirmation_token" ("release_id") ');
    await queryRunner.query(
      'CREATE UNIQUE INDEX "IDX_9d0bd0030fcbb63f0cb008c22c" ON "confirmation_token" ("token_hash") ',
    );
    await queryRunner.query(
      'CREATE TABLE "card_scan" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "card_id" integer NOT NULL, "event" varchar(10) NOT NULL, "from_state" varchar(10) NOT NULL, "to_state" varchar(10) NOT NULL, "user_email" varchar(254), "scanned_at" varchar(30) NOT NULL)',
    );
    await queryRunner.query('CREATE INDEX "IDX_968af45fcf22487d7252fac9e0" ON "card_scan" ("card_id") ');
    await queryRunner.query(
      'CREATE TABLE "kanban_card" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "loop_id" integer NOT NULL, "card_index" integer NOT NULL, "card_number" varchar(20) NOT NULL, "state" varchar(10) NOT NULL DEFAULT (\'full\'), "state_changed_at" varchar(30) NOT NULL, "retired_at" varchar(30), "release_line_id" integer)',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_a2b5a55fcd5f3feb5e4cf3768b" ON "kanban_card" ("card_number") ');
    await queryRunner.query(
      'CREATE UNIQUE INDEX "IDX_4f11cd6bbf653c6a3c7d630745" ON "kanban_card" ("loop_id", "card_index") ',
    );
    await queryRunner.query(
      'CREATE TABLE "kanban_loop" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "part_number" varchar(40) NOT NULL, "kind" varchar(12) NOT NULL DEFAULT (\'supplier\'), "container_qty" double precision NOT NULL, "safety_factor" double precision NOT NULL DEFAULT (0), "safety_days" double precision NOT NULL DEFAULT (0), "safety_units" double precision NOT NULL DEFAULT (0), "sizing_window_days" integer NOT NULL DEFAULT (20))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_ce4f4970e46db3c9ffdaca0326" ON "kanban_loop" ("part_number") ');
    await queryRunner.query(
      'CREATE TABLE "outbox_message" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "to_address" varchar(254) NOT NULL, "subject" varchar(250) NOT NULL, "text" text NOT NULL, "html" text, "attachments" text, "status" varchar(10) NOT NULL DEFAULT (\'pending\'), "attempts" integer NOT NULL DEFAULT (0), "next_attempt_at" varchar(30) NOT NULL, "last_error" text, "created_at" varchar(30) NOT NULL, "sent_at" varchar(30))',
    );
    await queryRunner.query(
      'CREATE INDEX "IDX_3e1d188faf16b1e79c1c4ef3e1" ON "outbox_message" ("status", "next_attempt_at") ',
    );
    await queryRunner.query(
      'CREATE TABLE "part" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "part_number" varchar(40) NOT NULL, "description" varchar(200) NOT NULL, "uom" varchar(3) NOT NULL DEFAULT (\'H87\'), "source" varchar(10) NOT NULL, "supplier_code" varchar(20), "lead_time_days" integer NOT NULL DEFAULT (0), "pack_qty" double precision NOT NULL DEFAULT (1), "on_hand" double precision NOT NULL DEFAULT (0), "replenishment" varchar(10), "safety_stock" double precision NOT NULL DEFAULT (0), "point_of_use" varchar(40), "hazardous" boolean NOT NULL DEFAULT (0))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_db89cbe876fb4aebe0f563683b" ON "part" ("part_number") ');
    await queryRunner.query('CREATE INDEX "IDX_e05f219539ad60724813a96ea1" ON "part" ("supplier_code") ');
    await queryRunner.query(
      'CREATE TABLE "attachment" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "release_id" integer NOT NULL, "receipt_id" integer, "file_name" varchar(200) NOT NULL, "mime_type" varchar(100) NOT NULL, "size_bytes" integer NOT NULL, "storage_path" varchar(300) NOT NULL, "uploaded_by" varchar(254) NOT NULL, "uploaded_at" varchar(30) NOT NULL)',
    );
    await queryRunner.query('CREATE INDEX "IDX_60ed56abac5617c65762442ec9" ON "attachment" ("release_id") ');
    await queryRunner.query(
      'CREATE TABLE "receipt" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "release_line_id" integer NOT NULL, "qty" double precision NOT NULL, "discrepancy" varchar(12), "note" text, "idempotency_key" varchar(100) NOT NULL, "on_hand_after" double precision NOT NULL, "user_email" varchar(254) NOT NULL, "received_at" varchar(30) NOT NULL)',
    );
    await queryRunner.query('CREATE INDEX "IDX_3475bdc1138b1755bb88399c75" ON "receipt" ("release_line_id") ');
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_bb0c03014ad0373feeaa268770" ON "receipt" ("idempotency_key") ');
    await queryRunner.query(
      'CREATE TABLE "release_line" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "release_id" integer NOT NULL, "part_number" varchar(40) NOT NULL, "qty" double precision NOT NULL, "need_date" varchar(10) NOT NULL, "origin" varchar(10) NOT NULL, "card_id" integer, "confirmed_qty" double precision, "ship_date" varchar(10), "received_qty" double precision NOT NULL DEFAULT (0), "closed" boolean NOT NULL DEFAULT (0))',
    );
    await queryRunner.query('CREATE INDEX "IDX_f042f1a9c0e300eca953c6dcfd" ON "release_line" ("release_id") ');
    await queryRunner.query('CREATE INDEX "IDX_6634ee8a6522847e989b69fc87" ON "release_line" ("part_number") ');
    await queryRunner.query(
      'CREATE TABLE "release" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "number" varchar(30) NOT NULL, "supplier_code" varchar(20) NOT NULL, "release_date" varchar(10) NOT NULL, "status" varchar(12) NOT NULL DEFAULT (\'draft\'), "sent_at" varchar(30), "confirmed_at" varchar(30), "carrier" varchar(60), "tracking_number" varchar(60), "supplier_note" text, "dock_column" varchar(12) NOT NULL DEFAULT (\'expected\'))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_f19642ecab2a425967958e4392" ON "release" ("number") ');
    await queryRunner.query(
      'CREATE UNIQUE INDEX "IDX_3e6ee55bd44b50ffe533bac085" ON "release" ("supplier_code", "release_date") ',
    );
    await queryRunner.query(
      'CREATE TABLE "sequence_entry" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "date" varchar(10) NOT NULL, "sequence" integer NOT NULL, "model" varchar(40) NOT NULL, "serial" varchar(40) NOT NULL, "qty" integer NOT NULL DEFAULT (1))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_90277ae1cd6dc2bd36e11fb82c" ON "sequence_entry" ("serial") ');
    await queryRunner.query('CREATE INDEX "IDX_2d11d24aa72677db332813889b" ON "sequence_entry" ("date", "sequence") ');
    await queryRunner.query('CREATE TABLE "setting" ("key" varchar(60) PRIMARY KEY NOT NULL, "value" text NOT NULL)');
    await queryRunner.query(
      'CREATE TABLE "supplier" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "code" varchar(20) NOT NULL, "name" varchar(120) NOT NULL, "email" varchar(254) NOT NULL, "lead_time_days" integer NOT NULL DEFAULT (0), "cycle_days" integer NOT NULL DEFAULT (1), "deliveries_per_cycle" integer NOT NULL DEFAULT (1), "delivery_delay" integer NOT NULL DEFAULT (1))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_e1183babf2fed1bb440905b1e5" ON "supplier" ("code") ');
    await queryRunner.query(
      'CREATE TABLE "user" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "email" varchar(254) NOT NULL, "name" varchar(120) NOT NULL, "role" varchar(20) NOT NULL, "password_hash" varchar(255) NOT NULL, "supplier_code" varchar(20), "active" boolean NOT NULL DEFAULT (1), "created_at" datetime NOT NULL DEFAULT (datetime(\'now\')))',
    );
    await queryRunner.query('CREATE UNIQUE INDEX "IDX_e12875dfb3b1d92d7d7c5377e2" ON "user" ("email") ');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP INDEX "IDX_e12875dfb3b1d92d7d7c5377e2"');
    await queryRunner.query('DROP TABLE "user"');
    await queryRunner.query('DROP INDEX "IDX_e1183babf2fed1bb440905b1e5"');
    await queryRunner.query('DROP TABLE "supplier"');
    await queryRunner.query('DROP TABLE "setting"');
    await queryRunner.query('DROP INDEX "IDX_2d11d24aa72677db332813889b"');
    await queryRunner.query('DROP INDEX "IDX_90277ae1cd6dc2bd36e11fb82c"');
    await queryRunner.query('DROP TABLE "sequence_entry"');
    await queryRunner.query('DROP INDEX "IDX_3e6ee55bd44b50ffe533bac085"');
    await queryRunner.query('DROP INDEX "IDX_f19642ecab2a425967958e4392"');
    await queryRunner.query('DROP TABLE "release"');
    await queryRunner.query('DROP INDEX "IDX_6634ee8a6522847e989b69fc87"');
    await queryRunner.query('DROP INDEX "IDX_f042f1a9c0e300eca953c6dcfd"');
    await queryRunner.query('DROP TABLE "release_line"');
    await queryRunner.query('DROP INDEX "IDX_bb0c03014ad0373feeaa268770"');
    await queryRunner.query('DROP INDEX "IDX_3475bdc1138b1755bb88399c75"');
    await queryRunner.query('DROP TABLE "receipt"');
    await queryRunner.query('DROP INDEX "IDX_60ed56abac5617c65762442ec9"');
    await queryRunner.query('DROP TABLE "attachment"');
    await queryRunner.query('DROP INDEX "IDX_e05f219539ad60724813a96ea1"');
    await queryRunner.query('DROP INDEX "IDX_db89cbe876fb4aebe0f563683b"');
    await queryRunner.query('DROP TABLE "part"');
    await queryRunner.query('DROP INDEX "IDX_3e1d188faf16b1e79c1c4ef3e1"');
    await queryRunner.query('DROP TABLE "outbox_message"');
    await queryRunner.query('DROP INDEX "IDX_ce4f4970e46db3c9ffdaca0326"');
    await queryRunner.query('DROP TABLE "kanban_loop"');
    await queryRunner.query('DROP INDEX "IDX_4f11cd6bbf653c6a3c7d630745"');
    await queryRunner.query('DROP INDEX "IDX_a2b5a55fcd5f3feb5e4cf3768b"');
    await queryRunner.query('DROP TABLE "kanban_card"');
    await queryRunner.query('DROP INDEX "IDX_968af45fcf22487d7252fac9e0"');
    await queryRunner.query('DROP TABLE "card_scan"');
    await queryRunner.query('DROP INDEX "IDX_9d0bd0030fcbb63f0cb008c22c"');
    await queryRunner.query('DROP INDEX "IDX_731b377c510eb07390927e3977"');
    await queryRunner.query('DROP TABLE "confirmation_token"');
    await queryRunner.query('DROP TABLE "plant_holiday"');
    await queryRunner.query('DROP INDEX "IDX_feae85fe2d4a2103c9ab395f56"');
    await queryRunner.query('DROP INDEX "IDX_bbb5c56a8048760cf098b878e4"');
    await queryRunner.query('DROP TABLE "bom_line"');
    await queryRunner.query('DROP INDEX "IDX_4cf52b7d3b370111cfe3ab0efe"');
    await queryRunner.query('DROP TABLE "audit_event"');
  }
}
