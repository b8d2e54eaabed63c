import { type MigrationInterface, type QueryRunner } from 'typeorm';

/** The FHIR outbox (one row per version of a treatment's bundle) and a patient's FHIR source. */
export class FhirInterop1796313422761 implements MigrationInterface {
  name = 'FhirInterop1796313422761';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`fhir_delivery\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`version\` smallint UNSIGNED NOT NULL, \`reason\` varchar(60) NOT NULL, \`bundle\` json NOT NULL, \`status\` enum ('pending', 'sent', 'failed', 'superseded') NOT NULL DEFAULT 'pending', \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0', \`next_attempt_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`last_error\` varchar(500) NULL, \`sent_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_fhir_delivery_order_version\` (\`order_id\`, \`version\`), INDEX \`ix_fhir_delivery_due\` (\`status\`, \`next_attempt_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(`ALTER TABLE \`patient\` ADD \`fhir_source\` varchar(300) NULL`);
    await queryRunner.query(`ALTER TABLE \`patient\` ADD \`fhir_id\` varchar(64) NULL`);
    await queryRunner.query(`ALTER TABLE \`patient\` ADD \`fhir_read_at\` datetime(3) NULL`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`patient\` DROP COLUMN \`fhir_read_at\``);
    await queryRunner.query(`ALTER TABLE \`patient\` DROP COLUMN \`fhir_id\``);
    await queryRunner.query(`ALTER TABLE \`patient\` DROP COLUMN \`fhir_source\``);
    await queryRunner.query(`DROP INDEX \`ix_fhir_delivery_due\` ON \`fhir_delivery\``);
    await queryRunner.query(`DROP INDEX \`uq_fhir_delivery_order_version\` ON \`fhir_delivery\``);
    await queryRunner.query(`DROP TABLE \`fhir_delivery\``);
  }
}
