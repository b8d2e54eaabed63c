import { Like, type DataSource } from 'typeorm';
import { managerOf, type Transaction } from '../db/unit-of-work';
import { lengthToCm, massToKg } from '../../shared/engine/units';
import type { PlanInputs } from '../../shared/schemas/calculation';
import type { RecordedMeasurement } from '../../shared/schemas/patients';
import { Patient } from '../db/entities/patient';
import { PatientMeasurement } from '../db/entities/patient-measurement';

/** The height and weight of an order's inputs as a measurement row keeps them; null when it has neither. */
export function measuredFrom(inputs: PlanInputs) {
  const { height, weight } = inputs;
  if (!height && !weight) return null;
  return {
    heightValue: height?.value ?? null,
    heightUnit: height?.unit ?? null,
    heightCm: height ? lengthToCm(height.value, height.unit) : null,
    weightValue: weight?.value ?? null,
    weightUnit: weight?.unit ?? null,
    weightKg: weight ? massToKg(weight.value, weight.unit) : null,
  };
}

function toRecordedMeasurement(m: PatientMeasurement): RecordedMeasurement {
  return {
    orderId: m.orderId,
    measuredAt: m.measuredAt.toISOString(),
    height:
      m.heightValue !== null && m.heightUnit !== null
        ? { value: m.heightValue, unit: m.heightUnit }
        : null,
    heightCm: m.heightCm,
    weight:
      m.weightValue !== null && m.weightUnit !== null
        ? { value: m.weightValue, unit: m.weightUnit }
        : null,
    weightKg: m.weightKg,
  };
}

export function createPatientRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(Patient);
  return {
    findById: (id: number) => repo.findOneBy({ id }),
    findByRecordNumber: (recordNumber: string) => repo.findOneBy({ recordNumber }),
    search: (text: string | undefined, limit: number) =>
      repo.find({
        where: text
          ? [
              { recordNumber: Like(`${escapeLike(text)}%`) },
              { familyName: Like(`${escapeLike(text)}%`) },
              { givenName: Like(`${escapeLike(text)}%`) },
            ]
          : {},
        order: { familyName: 'ASC', givenName: 'ASC' },
        take: limit,
      }),
    /** Patients with this name and date of birth (the column collation ignores letter case). */
    findByNameAndBirth: (givenName: string, familyName: string, dateOfBirth: string) =>
      repo.find({
        where: { givenName, familyName, dateOfBirth },
        order: { id: 'ASC' },
        take: 20,
      }),
    create: (
      patient: Omit<Patient, 'id' | 'createdAt' | 'fhirSource' | 'fhirId' | 'fhirReadAt'> &
        Partial<Pick<Patient, 'fhirSource' | 'fhirId' | 'fhirReadAt'>>,
    ) => repo.save(repo.create(patient)),

    /**
     * The patient's recorded measurements, newest first. Rows of revisions an amendment replaced
     * are left out (the amendment carries the corrected figures), and so are the orders named.
     */
    async lastMeasurements(
      patientId: number,
      options: { limit: number; excludeOrderIds?: number[]; withWeight?: boolean },
    ): Promise<RecordedMeasurement[]> {
      const qb = dataSource
        .getRepository(PatientMeasurement)
        .createQueryBuilder('m')
        .innerJoin('m.order', 'o')
        .where('m.patientId = :patientId', { patientId })
        .andWhere('o.status <> :superseded', { superseded: 'superseded' })
        .orderBy('m.measuredAt', 'DESC')
        .addOrderBy('m.id', 'DESC')
        .limit(options.limit);
      const excluded = options.excludeOrderIds ?? [];
      if (excluded.length) qb.andWhere('m.orderId NOT IN (:...excluded)', { excluded });
      if (options.withWeight) qb.andWhere('m.weightKg IS NOT NULL');
      return (await qb.getMany()).map(toRecordedMeasurement);
    },

    /** Written once, in the signing transaction. */
    async recordMeasurement(
      tx: Transaction,
      at: { patientId: number; orderId: number; measuredAt: Date },
      inputs: PlanInputs,
    ): Promise<void> {
      const measured = measuredFrom(inputs);
      if (measured)
        await managerOf(tx)
          .getRepository(PatientMeasurement)
          .insert({ ...at, ...measured });
    },
  };
}

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export type PatientRepository = ReturnType<typeof createPatientRepository>;
