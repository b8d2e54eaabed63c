// The patient API's shapes are read by every screen that shows a patient: src/lib/queries/patients.ts.
export {
  patientHistorySchema,
  treatmentSchema,
  type PatientHistory,
  type Treatment,
} from '../../../lib/queries/patients';
