import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class OrdersAndOutbox1796162437763 implements MigrationInterface {
  name = 'OrdersAndOutbox1796162437763';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`patient\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`record_number\` varchar(20) NOT NULL, \`given_name\` varchar(80) NOT NULL, \`family_name\` varchar(80) NOT NULL, \`date_of_birth\` date NOT NULL, \`email\` varchar(254) NULL, \`email_consent\` tinyint NOT NULL DEFAULT 0, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_patient_record_number\` (\`record_number\`), INDEX \`ix_patient_family_name\` (\`family_name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`treatment_order\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`patient_id\` int UNSIGNED NOT NULL, \`eye\` enum ('right', 'left') NOT NULL, \`protocol_version_id\` int UNSIGNED NOT NULL, \`status\` enum ('draft', 'signed', 'returned', 'checked', 'prepared', 'ready', 'in-session', 'completed', 'stopped', 'reviewed', 'superseded') NOT NULL, \`revision\` smallint UNSIGNED NOT NULL DEFAULT '1', \`previous_revision_id\` int UNSIGNED NULL, \`amendment_reason\` varchar(500) NULL, \`inputs\` json NOT NULL, \`plan\` json NOT NULL, \`engine_version\` varchar(20) NOT NULL, \`checklist\` json NOT NULL, \`soft_limit_reasons\` json NOT NULL, \`retreatment_reason\` varchar(500) NULL, \`note\` text NULL, \`created_by\` int UNSIGNED NOT NULL, \`signed_by\` int UNSIGNED NULL, \`signed_at\` datetime(3) NULL, \`signature_meaning\` varchar(20) NULL, \`return_comment\` varchar(1000) NULL, \`beyond_use_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`ix_order_protocol\` (\`protocol_version_id\`, \`created_at\`), INDEX \`ix_order_patient_eye\` (\`patient_id\`, \`eye\`, \`created_at\`), INDEX \`ix_order_status_created\` (\`status\`, \`created_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`attachment\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`file_name\` varchar(200) NOT NULL, \`mime_type\` varchar(40) NOT NULL, \`size_bytes\` int UNSIGNED NOT NULL, \`sha256\` char(64) NOT NULL, \`storage_name\` varchar(80) NOT NULL, \`uploaded_by\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_attachment_order\` (\`order_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`dose_check\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`pharmacist_id\` int UNSIGNED NOT NULL, \`bsa_m2\` double NOT NULL, \`dose_mg\` double NOT NULL, \`drug_volume_ml\` double NOT NULL, \`outcome\` enum ('match', 'mismatch') NOT NULL, \`differing\` json NOT NULL, \`comment\` varchar(1000) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_dose_check_order\` (\`order_id\`, \`created_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`outbox_message\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`kind\` varchar(64) NOT NULL, \`recipients\` json NOT NULL, \`subject\` varchar(200) NOT NULL, \`body\` text NOT NULL, \`status\` enum ('pending', 'sent', 'failed') NOT NULL DEFAULT 'pending', \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0', \`next_attempt_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`last_error\` varchar(500) NULL, \`sent_at\` datetime(3) NULL, \`related_type\` varchar(40) NULL, \`related_id\` varchar(40) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_outbox_due\` (\`status\`, \`next_attempt_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`preparation\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`pharmacist_id\` int UNSIGNED NOT NULL, \`vial_lot\` varchar(40) NOT NULL, \`vial_expiry\` date NOT NULL, \`reconstituted_at\` datetime(3) NOT NULL, \`volume_drawn_ml\` double NOT NULL, \`beyond_use_at\` datetime(3) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_preparation_order\` (\`order_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD CONSTRAINT \`FK_ead143e212ea464cc7d038827ad\` FOREIGN KEY (\`patient_id\`) REFERENCES \`patient\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD CONSTRAINT \`FK_6996dbe2ab058fb7553bdde4d98\` FOREIGN KEY (\`protocol_version_id\`) REFERENCES \`protocol_version\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD CONSTRAINT \`FK_6b018eadf7629bfdcc3bc5ae5f0\` FOREIGN KEY (\`created_by\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD CONSTRAINT \`FK_7e78f475d03bb9284e1ad9bce2e\` FOREIGN KEY (\`signed_by\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachment\` ADD CONSTRAINT \`FK_fa729a6c985e3ab6e342f70f4f3\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`dose_check\` ADD CONSTRAINT \`FK_7c3d31ecb4868027eb3d3be3fe2\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`dose_check\` ADD CONSTRAINT \`FK_c61f3cb83de77b90e50878ae88f\` FOREIGN KEY (\`pharmacist_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation\` ADD CONSTRAINT \`FK_f84bc7ba4b61d86b39f46babceb\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation\` ADD CONSTRAINT \`FK_e0d918b845259fed97bb8251abc\` FOREIGN KEY (\`pharmacist_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`preparation\` DROP FOREIGN KEY \`FK_e0d918b845259fed97bb8251abc\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation\` DROP FOREIGN KEY \`FK_f84bc7ba4b61d86b39f46babceb\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`dose_check\` DROP FOREIGN KEY \`FK_c61f3cb83de77b90e50878ae88f\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`dose_check\` DROP FOREIGN KEY \`FK_7c3d31ecb4868027eb3d3be3fe2\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachment\` DROP FOREIGN KEY \`FK_fa729a6c985e3ab6e342f70f4f3\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP FOREIGN KEY \`FK_7e78f475d03bb9284e1ad9bce2e\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP FOREIGN KEY \`FK_6b018eadf7629bfdcc3bc5ae5f0\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP FOREIGN KEY \`FK_6996dbe2ab058fb7553bdde4d98\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP FOREIGN KEY \`FK_ead143e212ea464cc7d038827ad\``,
    );
    await queryRunner.query(`DROP INDEX \`uq_preparation_order\` ON \`preparation\``);
    await queryRunner.query(`DROP TABLE \`preparation\``);
    await queryRunner.query(`DROP INDEX \`ix_outbox_due\` ON \`outbox_message\``);
    await queryRunner.query(`DROP TABLE \`outbox_message\``);
    await queryRunner.query(`DROP INDEX \`ix_dose_check_order\` ON \`dose_check\``);
    await queryRunner.query(`DROP TABLE \`dose_check\``);
    await queryRunner.query(`DROP INDEX \`ix_attachment_order\` ON \`attachment\``);
    await queryRunner.query(`DROP TABLE \`attachment\``);
    await queryRunner.query(`DROP INDEX \`ix_order_status_created\` ON \`treatment_order\``);
    await queryRunner.query(`DROP INDEX \`ix_order_patient_eye\` ON \`treatment_order\``);
    await queryRunner.query(`DROP INDEX \`ix_order_protocol\` ON \`treatment_order\``);
    await queryRunner.query(`DROP TABLE \`treatment_order\``);
    await queryRunner.query(`DROP INDEX \`ix_patient_family_name\` ON \`patient\``);
    await queryRunner.query(`DROP INDEX \`uq_patient_record_number\` ON \`patient\``);
    await queryRunner.query(`DROP TABLE \`patient\``);
  }
}
