import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class TreatmentListsAndStock1796313382388 implements MigrationInterface {
  name = 'TreatmentListsAndStock1796313382388';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`treatment_list\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`list_date\` date NOT NULL, \`room\` varchar(60) NOT NULL, \`device_label\` varchar(60) NULL, \`start_time\` char(5) NOT NULL, \`session_length_min\` smallint UNSIGNED NOT NULL, \`slot_min\` smallint UNSIGNED NOT NULL, \`created_by\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_list_date_room_start\` (\`list_date\`, \`room\`, \`start_time\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`list_booking\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`list_id\` int UNSIGNED NOT NULL, \`slot_index\` smallint UNSIGNED NOT NULL, \`order_id\` int UNSIGNED NOT NULL, \`patient_id\` int UNSIGNED NOT NULL, \`eye\` enum ('right', 'left') NOT NULL, \`booking_date\` date NOT NULL, \`starts_at\` datetime(3) NOT NULL, \`ends_at\` datetime(3) NOT NULL, \`booked_by\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_booking_patient_date\` (\`patient_id\`, \`booking_date\`), UNIQUE INDEX \`uq_booking_order\` (\`order_id\`), UNIQUE INDEX \`uq_booking_slot\` (\`list_id\`, \`slot_index\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`stock_lot\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`product\` varchar(60) NOT NULL, \`lot\` varchar(40) NOT NULL, \`expiry\` date NOT NULL, \`quantity_on_hand\` int UNSIGNED NOT NULL, \`received_quantity\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_stock_product_expiry\` (\`product\`, \`expiry\`), INDEX \`ix_stock_lot_lot\` (\`lot\`), UNIQUE INDEX \`uq_stock_product_lot\` (\`product\`, \`lot\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`preparation_stock\` (\`preparation_id\` int UNSIGNED NOT NULL, \`order_id\` int UNSIGNED NOT NULL, \`stock_lot_id\` int UNSIGNED NULL, \`vials_opened\` smallint UNSIGNED NOT NULL, \`dose_mg\` double NOT NULL, \`discarded_mg\` double NOT NULL, \`discard_reason\` varchar(500) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_prep_stock_created\` (\`created_at\`), INDEX \`ix_prep_stock_lot\` (\`stock_lot_id\`), PRIMARY KEY (\`preparation_id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`stock_movement\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`lot_id\` int UNSIGNED NOT NULL, \`kind\` enum ('received', 'issued', 'adjusted') NOT NULL, \`quantity_change\` int NOT NULL, \`quantity_after\` int UNSIGNED NOT NULL, \`reason\` varchar(500) NULL, \`order_id\` int UNSIGNED NULL, \`actor_id\` int UNSIGNED NOT NULL, \`occurred_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_movement_kind_time\` (\`kind\`, \`occurred_at\`), INDEX \`ix_movement_lot\` (\`lot_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_preparation_vial_lot\` ON \`preparation\` (\`vial_lot\`)`,
    );
    await queryRunner.query(
      `ALTER TABLE \`list_booking\` ADD CONSTRAINT \`FK_019dbc310237e39138b6f8afddd\` FOREIGN KEY (\`list_id\`) REFERENCES \`treatment_list\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`list_booking\` ADD CONSTRAINT \`FK_50288d1b3083fb542b020a05257\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation_stock\` ADD CONSTRAINT \`FK_020f9f28a5663ba7849a5547c71\` FOREIGN KEY (\`preparation_id\`) REFERENCES \`preparation\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation_stock\` ADD CONSTRAINT \`FK_95bf0d383134fd138da297fd1c8\` FOREIGN KEY (\`stock_lot_id\`) REFERENCES \`stock_lot\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`stock_movement\` ADD CONSTRAINT \`FK_e798cd64aa2e51cef6bf0a8d0b0\` FOREIGN KEY (\`lot_id\`) REFERENCES \`stock_lot\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`stock_movement\` DROP FOREIGN KEY \`FK_e798cd64aa2e51cef6bf0a8d0b0\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation_stock\` DROP FOREIGN KEY \`FK_95bf0d383134fd138da297fd1c8\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`preparation_stock\` DROP FOREIGN KEY \`FK_020f9f28a5663ba7849a5547c71\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`list_booking\` DROP FOREIGN KEY \`FK_50288d1b3083fb542b020a05257\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`list_booking\` DROP FOREIGN KEY \`FK_019dbc310237e39138b6f8afddd\``,
    );
    await queryRunner.query(`DROP INDEX \`ix_preparation_vial_lot\` ON \`preparation\``);
    await queryRunner.query(`DROP INDEX \`ix_movement_lot\` ON \`stock_movement\``);
    await queryRunner.query(`DROP INDEX \`ix_movement_kind_time\` ON \`stock_movement\``);
    await queryRunner.query(`DROP TABLE \`stock_movement\``);
    await queryRunner.query(`DROP INDEX \`ix_prep_stock_lot\` ON \`preparation_stock\``);
    await queryRunner.query(`DROP INDEX \`ix_prep_stock_created\` ON \`preparation_stock\``);
    await queryRunner.query(`DROP TABLE \`preparation_stock\``);
    await queryRunner.query(`DROP INDEX \`uq_stock_product_lot\` ON \`stock_lot\``);
    await queryRunner.query(`DROP INDEX \`ix_stock_lot_lot\` ON \`stock_lot\``);
    await queryRunner.query(`DROP INDEX \`ix_stock_product_expiry\` ON \`stock_lot\``);
    await queryRunner.query(`DROP TABLE \`stock_lot\``);
    await queryRunner.query(`DROP INDEX \`uq_booking_slot\` ON \`list_booking\``);
    await queryRunner.query(`DROP INDEX \`uq_booking_order\` ON \`list_booking\``);
    await queryRunner.query(`DROP INDEX \`ix_booking_patient_date\` ON \`list_booking\``);
    await queryRunner.query(`DROP TABLE \`list_booking\``);
    await queryRunner.query(`DROP INDEX \`uq_list_date_room_start\` ON \`treatment_list\``);
    await queryRunner.query(`DROP TABLE \`treatment_list\``);
  }
}
