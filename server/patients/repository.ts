import { Like, type DataSource } from 'typeorm';
import { Patient } from '../db/entities/patient';

export function createPatientRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(Patient);
  return {
    findById: (id: number) => repo.findOneBy({ id }),
    findByRecordNumber: (recordNumber: string) => repo.findOneBy({ recordNumber }),
    search: (text: string | undefined, limit: number) =>
      repo.find({
        where: text ? [{ recordNumber: Like(`${escapeLike(text)}%`) }, { familyName: Like(`${escapeLike(text)}%`) }, { givenName: Like(`${escapeLike(text)}%`) }] : {},
        order: { familyName: 'ASC', givenName: 'ASC' },
        take: limit,
      }),
    create: (patient: Omit<Patient, 'id' | 'createdAt'>) => repo.save(repo.create(patient)),
  };
}

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export type PatientRepository = ReturnType<typeof createPatientRepository>;
