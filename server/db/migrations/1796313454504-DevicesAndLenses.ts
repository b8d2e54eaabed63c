import { type MigrationInterface, type QueryRunner } from 'typeorm';

const refuse = (message: string) => `SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${message}'`;

/**
 * The device and lens registers and the devices' output checks. A device or lens is never
 * deleted (a trigger refuses it, for the owner too); device versions and output checks are
 * append-only for the app (server/db/grants.ts).
 */
export class DevicesAndLenses1796313454504 implements MigrationInterface {
  name = 'DevicesAndLenses1796313454504';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`device\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`name\` varchar(80) NOT NULL, \`kind\` varchar(8) NOT NULL, \`wavelength_nm\` double NOT NULL, \`serial_number\` varchar(60) NOT NULL, \`location\` varchar(80) NOT NULL, \`power_min_mw\` double NULL, \`power_max_mw\` double NULL, \`spot_min_um\` double NULL, \`spot_max_um\` double NULL, \`irradiance_min_mw_per_cm2\` double NULL, \`irradiance_max_mw_per_cm2\` double NULL, \`pulsed_available\` tinyint NOT NULL, \`service_due_on\` date NOT NULL, \`status\` varchar(16) NOT NULL, \`out_of_service_reason\` varchar(500) NULL, \`version\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_device_name\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`device_version\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`device_id\` int UNSIGNED NOT NULL, \`version\` int UNSIGNED NOT NULL, \`snapshot\` json NOT NULL, \`changed_by_id\` int UNSIGNED NOT NULL, \`changed_at\` datetime(3) NOT NULL, UNIQUE INDEX \`uq_device_version\` (\`device_id\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`lens\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`name\` varchar(80) NOT NULL, \`laser_spot_factor\` double NOT NULL, \`image_magnification\` double NOT NULL, \`active\` tinyint NOT NULL DEFAULT 1, \`created_by_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_lens_name\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`output_check\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`device_id\` int UNSIGNED NOT NULL, \`checked_at\` datetime(3) NOT NULL, \`checked_by_id\` int UNSIGNED NOT NULL, \`quantity\` varchar(12) NOT NULL, \`set_value\` double NOT NULL, \`measured_value\` double NOT NULL, \`meter_identity\` varchar(80) NOT NULL, \`meter_calibration_due_on\` date NOT NULL, \`tolerance_pct\` double NOT NULL, \`tolerance_from\` varchar(80) NOT NULL, \`difference_pct\` double NOT NULL, \`passed\` tinyint NOT NULL, \`order_id\` int UNSIGNED NULL, \`note\` varchar(500) NULL, INDEX \`ix_output_check_device\` (\`device_id\`, \`checked_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`device_version\` ADD CONSTRAINT \`FK_f8dcdd42d8185e75f12af4c2031\` FOREIGN KEY (\`device_id\`) REFERENCES \`device\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`device_version\` ADD CONSTRAINT \`FK_71299fedec7d837ee36c8723e14\` FOREIGN KEY (\`changed_by_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`lens\` ADD CONSTRAINT \`FK_d32fcb6f11edca4c6458b6935ea\` FOREIGN KEY (\`created_by_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`output_check\` ADD CONSTRAINT \`FK_807d6d34a82bf8f76e63b2f66cb\` FOREIGN KEY (\`device_id\`) REFERENCES \`device\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`output_check\` ADD CONSTRAINT \`FK_ec93c88f4056411b0962ee6c37f\` FOREIGN KEY (\`checked_by_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(`CREATE TRIGGER \`device_not_deleted\` BEFORE DELETE ON \`device\` FOR EACH ROW
            BEGIN ${refuse('A device is never deleted; mark it out of service with its reason.')}; END`);
    await queryRunner.query(`CREATE TRIGGER \`lens_not_deleted\` BEFORE DELETE ON \`lens\` FOR EACH ROW
            BEGIN ${refuse('A lens is never deleted; retire it.')}; END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`lens_not_deleted\``);
    await queryRunner.query(`DROP TRIGGER \`device_not_deleted\``);
    await queryRunner.query(
      `ALTER TABLE \`output_check\` DROP FOREIGN KEY \`FK_ec93c88f4056411b0962ee6c37f\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`output_check\` DROP FOREIGN KEY \`FK_807d6d34a82bf8f76e63b2f66cb\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`lens\` DROP FOREIGN KEY \`FK_d32fcb6f11edca4c6458b6935ea\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`device_version\` DROP FOREIGN KEY \`FK_71299fedec7d837ee36c8723e14\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`device_version\` DROP FOREIGN KEY \`FK_f8dcdd42d8185e75f12af4c2031\``,
    );
    await queryRunner.query(`DROP INDEX \`ix_output_check_device\` ON \`output_check\``);
    await queryRunner.query(`DROP TABLE \`output_check\``);
    await queryRunner.query(`DROP INDEX \`uq_lens_name\` ON \`lens\``);
    await queryRunner.query(`DROP TABLE \`lens\``);
    await queryRunner.query(`DROP INDEX \`uq_device_version\` ON \`device_version\``);
    await queryRunner.query(`DROP TABLE \`device_version\``);
    await queryRunner.query(`DROP INDEX \`uq_device_name\` ON \`device\``);
    await queryRunner.query(`DROP TABLE \`device\``);
  }
}
