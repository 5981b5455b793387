import { Table, type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Packing slips are kept in the database, beside their attachment row, so every app node serves
 * them and a database backup holds them. Base64 text: one column type that both engines store
 * alike (SQLite's BLOB and PostgreSQL's bytea differ); slips are at most 10 MB.
 */
export class AttachmentContent1764950000000 implements MigrationInterface {
  name = 'AttachmentContent1764950000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'attachment_content',
        columns: [
          { name: 'attachment_id', type: 'integer', isPrimary: true },
          { name: 'content_base64', type: 'text' },
        ],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('attachment_content');
  }
}
