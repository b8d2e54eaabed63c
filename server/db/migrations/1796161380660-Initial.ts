import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class Initial1796161380660 implements MigrationInterface {
  name = 'Initial1796161380660';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`audit_event\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`occurred_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`actor_user_id\` int UNSIGNED NULL, \`action\` varchar(64) NOT NULL, \`entity_type\` varchar(64) NULL, \`entity_id\` varchar(64) NULL, \`ip_address\` varchar(64) NULL, \`details\` json NULL, INDEX \`ix_audit_event_actor\` (\`actor_user_id\`, \`occurred_at\`), INDEX \`ix_audit_event_entity\` (\`entity_type\`, \`entity_id\`), INDEX \`ix_audit_event_occurred_at\` (\`occurred_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`user\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`email\` varchar(254) NOT NULL, \`display_name\` varchar(120) NOT NULL, \`password_hash\` varchar(100) NOT NULL, \`roles\` set ('clinician', 'nurse', 'pharmacist', 'auditor', 'admin') NOT NULL, \`active\` tinyint NOT NULL DEFAULT 1, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_user_email\` (\`email\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`uq_user_email\` ON \`user\``);
    await queryRunner.query(`DROP TABLE \`user\``);
    await queryRunner.query(`DROP INDEX \`ix_audit_event_occurred_at\` ON \`audit_event\``);
    await queryRunner.query(`DROP INDEX \`ix_audit_event_entity\` ON \`audit_event\``);
    await queryRunner.query(`DROP INDEX \`ix_audit_event_actor\` ON \`audit_event\``);
    await queryRunner.query(`DROP TABLE \`audit_event\``);
  }
}
