import { fhirSystems } from '../../shared/fhir/codes';
import { demoPatients } from '../demo/seed';

/**
 * The fictitious Marram Point hospital's patients as its FHIR server holds them: the demo
 * patients Luxtempo already has, and a few it has not met yet (to add from the hospital record).
 */
const notYetInLuxtempo = [
  {
    recordNumber: 'MP-100301',
    givenName: 'Ottoline',
    familyName: 'Ferncastle',
    dateOfBirth: '1957-05-09',
    gender: 'female',
  },
  {
    recordNumber: 'MP-100302',
    givenName: 'Leopold',
    familyName: 'Saltmarsh',
    dateOfBirth: '1949-12-30',
    gender: 'male',
  },
  {
    recordNumber: 'MP-100303',
    givenName: 'Perpetua',
    familyName: 'Dunnock',
    dateOfBirth: '1995-02-17',
    gender: 'female',
  },
  {
    recordNumber: 'MP-100304',
    givenName: 'Anselm',
    familyName: 'Ravensmoor',
    dateOfBirth: '2003-08-04',
    gender: 'male',
  },
];

export function demoFhirPatients() {
  const all = [...demoPatients.map((p) => ({ ...p, gender: 'unknown' })), ...notYetInLuxtempo];
  return all.map((p) => ({
    resourceType: 'Patient',
    id: `mp-${p.recordNumber.replace(/^MP-/, '')}`,
    identifier: [
      {
        use: 'usual',
        type: { text: 'Medical record number' },
        system: fhirSystems.recordNumber,
        value: p.recordNumber,
      },
    ],
    name: [{ use: 'official', family: p.familyName, given: [p.givenName] }],
    gender: p.gender,
    birthDate: p.dateOfBirth,
    meta: {},
  }));
}
