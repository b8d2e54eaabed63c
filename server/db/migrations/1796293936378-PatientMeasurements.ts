import { type MigrationInterface, type QueryRunner } from 'typeorm';
import { lengthToCm, massToKg } from '../../../shared/engine/units';
import type { PlanInputs } from '../../../shared/schemas/calculation';

export class PatientMeasurements1796293936378 implements MigrationInterface {
  name = 'PatientMeasurements1796293936378';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`patient_measurement\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`patient_id\` int UNSIGNED NOT NULL, \`order_id\` int UNSIGNED NOT NULL, \`measured_at\` datetime(3) NOT NULL, \`height_value\` double NULL, \`height_unit\` varchar(4) NULL, \`height_cm\` double NULL, \`weight_value\` double NULL, \`weight_unit\` varchar(4) NULL, \`weight_kg\` double NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_patient_measurement_order\` (\`order_id\`), INDEX \`ix_patient_measurement_patient\` (\`patient_id\`, \`measured_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`weight_change_reason\` varchar(500) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`patient_measurement\` ADD CONSTRAINT \`FK_6fc415eebd471c9e16592009593\` FOREIGN KEY (\`patient_id\`) REFERENCES \`patient\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`patient_measurement\` ADD CONSTRAINT \`FK_6d325aa789ab100d2b09d28b67f\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    // Orders signed before this table get their measurements once, as typed and in cm and kg.
    const signed: { id: number; patientId: number; signedAt: Date; inputs: PlanInputs | string }[] =
      await queryRunner.query(
        `SELECT id, patient_id AS patientId, signed_at AS signedAt, inputs FROM \`treatment_order\` WHERE signed_at IS NOT NULL ORDER BY id`,
      );
    for (const row of signed) {
      const inputs: PlanInputs =
        typeof row.inputs === 'string' ? JSON.parse(row.inputs) : row.inputs;
      const { height, weight } = inputs;
      if (!height && !weight) continue;
      await queryRunner.query(
        `INSERT INTO \`patient_measurement\` (patient_id, order_id, measured_at, height_value, height_unit, height_cm, weight_value, weight_unit, weight_kg) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
        [
          row.patientId,
          row.id,
          row.signedAt,
          height?.value ?? null,
          height?.unit ?? null,
          height ? lengthToCm(height.value, height.unit) : null,
          weight?.value ?? null,
          weight?.unit ?? null,
          weight ? massToKg(weight.value, weight.unit) : null,
        ],
      );
    }
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`patient_measurement\` DROP FOREIGN KEY \`FK_6d325aa789ab100d2b09d28b67f\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`patient_measurement\` DROP FOREIGN KEY \`FK_6fc415eebd471c9e16592009593\``,
    );
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`weight_change_reason\``);
    await queryRunner.query(
      `DROP INDEX \`ix_patient_measurement_patient\` ON \`patient_measurement\``,
    );
    await queryRunner.query(
      `DROP INDEX \`uq_patient_measurement_order\` ON \`patient_measurement\``,
    );
    await queryRunner.query(`DROP TABLE \`patient_measurement\``);
  }
}
