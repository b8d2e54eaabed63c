import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class AccountsAndSessions1796293735643 implements MigrationInterface {
  name = 'AccountsAndSessions1796293735643';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`user\` ADD \`password_changed_at\` datetime(3) NULL`);
    await queryRunner.query(
      `CREATE TABLE \`sign_in_session\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`token_hash\` char(64) NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`last_seen_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`expires_at\` datetime(3) NOT NULL, \`revoked_at\` datetime(3) NULL, \`revoked_reason\` varchar(40) NULL, \`ip_address\` varchar(64) NULL, INDEX \`ix_sign_in_session_user\` (\`user_id\`, \`revoked_at\`), UNIQUE INDEX \`uq_sign_in_session_token\` (\`token_hash\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`password_link\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`token_hash\` char(64) NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`purpose\` enum ('new-account', 'reset') NOT NULL, \`created_by\` int UNSIGNED NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`expires_at\` datetime(3) NOT NULL, \`used_at\` datetime(3) NULL, INDEX \`ix_password_link_user\` (\`user_id\`), UNIQUE INDEX \`uq_password_link_token\` (\`token_hash\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`sign_in_throttle\` (\`throttle_key\` varchar(300) NOT NULL, \`failures\` int UNSIGNED NOT NULL DEFAULT 0, \`last_failure_at\` datetime(3) NOT NULL, \`wait_until\` datetime(3) NULL, PRIMARY KEY (\`throttle_key\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`role_request\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`roles\` set ('clinician', 'nurse', 'pharmacist', 'auditor', 'admin') NOT NULL, \`requested_by\` int UNSIGNED NOT NULL, \`requested_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`status\` enum ('pending', 'approved', 'rejected', 'withdrawn') NOT NULL DEFAULT 'pending', \`decided_by\` int UNSIGNED NULL, \`decided_at\` datetime(3) NULL, INDEX \`ix_role_request_status\` (\`status\`, \`user_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    // Everyone who already has a password counts as having set it.
    await queryRunner.query(`UPDATE \`user\` SET \`password_changed_at\` = \`updated_at\``);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE \`role_request\``);
    await queryRunner.query(`DROP TABLE \`sign_in_throttle\``);
    await queryRunner.query(`DROP TABLE \`password_link\``);
    await queryRunner.query(`DROP TABLE \`sign_in_session\``);
    await queryRunner.query(`ALTER TABLE \`user\` DROP COLUMN \`password_changed_at\``);
  }
}
