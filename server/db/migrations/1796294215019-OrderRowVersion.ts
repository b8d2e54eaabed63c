import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class OrderRowVersion1796294215019 implements MigrationInterface {
  name = 'OrderRowVersion1796294215019';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`row_version\` int UNSIGNED NOT NULL DEFAULT '1'`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX \`uq_order_previous_revision\` ON \`treatment_order\` (\`previous_revision_id\`)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`uq_order_previous_revision\` ON \`treatment_order\``);
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`row_version\``);
  }
}
