/**
 * The code systems and codes Luxtempo's FHIR R4 resources use, in one place. Each external code
 * says where it comes from; a code marked "from memory" was not checked against the code
 * system's own release here.
 */

export const fhirSystems = {
  loinc: 'http://loinc.org',
  snomed: 'http://snomed.info/sct',
  ucum: 'http://unitsofmeasure.org',
  observationCategory: 'http://terminology.hl7.org/CodeSystem/observation-category',
  /** The unit's record-number identifiers (the hospital's medical record number). */
  recordNumber: 'urn:luxtempo:marram-point:record-number',
  /** Luxtempo's own identifiers: a treatment record (one per order) and a member of staff. */
  treatmentRecord: 'urn:luxtempo:treatment-record',
  staff: 'urn:luxtempo:staff',
  /** Luxtempo's own codes, for what no public code system names (a fluence delivered, a deviation). */
  local: 'urn:luxtempo:codes',
} as const;

export interface Coding {
  system: string;
  code: string;
  display: string;
}

/** LOINC codes for the body measures (from memory: 8302-2, 29463-7 and 8277-6 are the LOINC vital-sign codes FHIR's own examples use). */
export const loincCodes = {
  bodyHeight: { system: fhirSystems.loinc, code: '8302-2', display: 'Body height' },
  bodyWeight: { system: fhirSystems.loinc, code: '29463-7', display: 'Body weight' },
  bodySurfaceArea: { system: fhirSystems.loinc, code: '8277-6', display: 'Body surface area' },
} satisfies Record<string, Coding>;

/** SNOMED CT concepts (from memory; each site's terminology service should confirm them). */
export const snomedCodes = {
  rightEye: { system: fhirSystems.snomed, code: '18944008', display: 'Right eye structure' },
  leftEye: { system: fhirSystems.snomed, code: '8966001', display: 'Left eye structure' },
  eye: { system: fhirSystems.snomed, code: '81745001', display: 'Structure of eye proper' },
  right: { system: fhirSystems.snomed, code: '24028007', display: 'Right' },
  left: { system: fhirSystems.snomed, code: '7771000', display: 'Left' },
  intravenous: { system: fhirSystems.snomed, code: '47625008', display: 'Intravenous route' },
} satisfies Record<string, Coding>;

/** Luxtempo's own codes (no public code was checked for these; a site maps them if it must). */
export const localCodes = {
  pdt: { system: fhirSystems.local, code: 'pdt', display: 'Verteporfin photodynamic therapy' },
  cxl: {
    system: fhirSystems.local,
    code: 'cxl',
    display: 'Riboflavin/UVA corneal cross-linking',
  },
  completed: { system: fhirSystems.local, code: 'completed', display: 'Session completed' },
  stopped: { system: fhirSystems.local, code: 'stopped', display: 'Session stopped early' },
  deliveredLight: {
    system: fhirSystems.local,
    code: 'delivered-light',
    display: 'Light delivered: fluence, exposure and irradiance',
  },
  deliveredFluence: {
    system: fhirSystems.local,
    code: 'delivered-fluence',
    display: 'Delivered fluence',
  },
  exposure: { system: fhirSystems.local, code: 'exposure-time', display: 'Light on-time' },
  irradiance: { system: fhirSystems.local, code: 'irradiance', display: 'Irradiance' },
  thicknessBeforeUv: {
    system: fhirSystems.local,
    code: 'stromal-thickness-before-uv',
    display: 'Stromal thickness before UV',
  },
  deviation: {
    system: fhirSystems.local,
    code: 'protocol-deviation',
    display: 'Deviation from protocol',
  },
  expected: { system: fhirSystems.local, code: 'expected', display: 'Expected by protocol' },
  actual: { system: fhirSystems.local, code: 'actual', display: 'Actual' },
} satisfies Record<string, Coding>;

/**
 * Every UCUM unit Luxtempo writes, as the `code` of a Quantity; the tests check each against a
 * UCUM parser. `unit` is the same text (UCUM's case-sensitive form reads well enough here).
 */
export const ucumUnits = [
  'cm',
  'kg',
  'm2',
  'mg',
  'mL',
  'mL/min',
  'J/cm2',
  'mW/cm2',
  's',
  'min',
  'h',
  'um',
  '%',
] as const;
export type UcumUnit = (typeof ucumUnits)[number];
