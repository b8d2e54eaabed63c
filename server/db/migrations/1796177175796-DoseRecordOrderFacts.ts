import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class DoseRecordOrderFacts1796177175796 implements MigrationInterface {
  name = 'DoseRecordOrderFacts1796177175796';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`dose_record\` ADD \`eye\` enum ('right', 'left') NULL`);
    await queryRunner.query(`ALTER TABLE \`dose_record\` ADD \`patient_id\` int UNSIGNED NULL`);
    await queryRunner.query(`ALTER TABLE \`dose_record\` ADD \`planned_dose_mg\` double NULL`);
    await queryRunner.query(
      `ALTER TABLE \`dose_record\` ADD \`planned_fluence_j_per_cm2\` double NULL`,
    );
    // Records written before these columns get them from their orders, once.
    await queryRunner.query(
      `UPDATE \`dose_record\` r JOIN \`treatment_order\` o ON o.id = r.order_id SET r.eye = o.eye, r.patient_id = o.patient_id, r.planned_dose_mg = JSON_VALUE(o.plan, '$.doseMg'), r.planned_fluence_j_per_cm2 = JSON_VALUE(o.plan, '$.fluenceJPerCm2')`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`dose_record\` DROP COLUMN \`planned_fluence_j_per_cm2\``,
    );
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`planned_dose_mg\``);
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`patient_id\``);
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`eye\``);
  }
}
