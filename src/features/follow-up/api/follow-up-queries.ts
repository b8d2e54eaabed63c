import { queryOptions } from '@tanstack/react-query';
import type {
  OutcomesQuery,
  RecordComplication,
  RecordVisit,
} from '../../../../shared/schemas/follow-up';
import { api } from '../../../lib/api-client';
import { searchOf, segment } from '../../../lib/queries/request';
import type { Fetching } from '../../../lib/queries/request';

/** A follow-up visit as the server answers it (server/follow-up/service.ts, toVisitDto). */
export interface FollowUpVisit {
  id: number;
  orderId: number;
  eye: 'right' | 'left';
  kind: 'pdt' | 'cxl';
  visitKey: string;
  label: string;
  offsetDays: number;
  dueOn: string;
  windowDays: number;
  state: 'recorded' | 'planned' | 'due' | 'overdue' | 'missed';
  seenOn: string | null;
  acuity: { notation: string; entry: string; logMar: number; letters: number } | null;
  pdt: {
    centralSubfieldThicknessUm: number | null;
    subretinalFluid: string | null;
    leakage: string | null;
    retreatmentDecision: string | null;
  } | null;
  cxl: {
    kmaxD: number | null;
    thinnestPachymetryUm: number | null;
    endothelialCellsPerMm2: number | null;
    hazeGrade: number | null;
  } | null;
  note: string | null;
  attachments: { id: number; fileName: string }[];
}

export interface ComplicationRow {
  id: number;
  orderId: number;
  followUpVisitId: number | null;
  eye: 'right' | 'left';
  kind: string;
  kindLabel: string;
  severity: string;
  onsetOn: string;
  outcome: string;
  note: string | null;
  recordedAt: string;
  reviewedAt: string | null;
}

export interface FollowUpTreatment {
  orderId: number;
  eye: 'right' | 'left';
  kind: 'pdt' | 'cxl';
  sessionOutcome: string;
  treatedOn: string;
  protocol: { key: string; version: number; title: string };
  planFrom: { key: string; version: number } | null;
  outcomeLabel: string | null;
  complicationKinds: { id: string; label: string }[];
  visits: FollowUpVisit[];
  complications: ComplicationRow[];
}

export interface PatientFollowUp {
  today: string;
  treatments: FollowUpTreatment[];
}

export interface ShareWithInterval {
  count: number;
  total: number;
  share: number | null;
  lower: number | null;
  upper: number | null;
}

export interface OutcomeRow {
  protocolKey: string;
  protocolTitle: string;
  kind: 'pdt' | 'cxl';
  outcomeLabel: string | null;
  treatedEyes: number;
  reached: number;
  notReached: number;
  lostToFollowUp: number;
  pending: number;
  notAssessable: number;
  share: ShareWithInterval;
  shareIfLostFailed: ShareWithInterval;
  meanAcuityChangeLogMar: number | null;
  meanAcuityChangeLetters: number | null;
  acuityPairs: number;
  eyesWithComplication: number;
  complicationRate: ShareWithInterval;
}

export interface PChartPoint {
  label: string;
  count: number;
  total: number;
  share: number | null;
  lowerLimit: number | null;
  upperLimit: number | null;
  signal: 'above-upper-limit' | 'below-lower-limit' | null;
  words: string;
}

export interface OutcomesAnswer {
  today: string;
  protocols: OutcomeRow[];
  charts: { id: string; title: string; centre: number | null; points: PChartPoint[] }[];
}

export interface OverdueVisit {
  id: number;
  orderId: number;
  patientId: number;
  recordNumber: string;
  givenName: string;
  familyName: string;
  eye: 'right' | 'left';
  visitLabel: string;
  dueOn: string;
  daysOverdue: number;
}

export const followUpKeys = {
  all: () => ['follow-up'] as const,
  patient: (patientId: number) => [...followUpKeys.all(), 'patient', patientId] as const,
  overdue: () => [...followUpKeys.all(), 'overdue'] as const,
  outcomes: (query: OutcomesQuery) => [...followUpKeys.all(), 'outcomes', query] as const,
};

export const followUpQueries = {
  patient: (patientId: number) =>
    queryOptions({
      queryKey: followUpKeys.patient(patientId),
      queryFn: ({ signal }: Fetching) =>
        api.get<PatientFollowUp>(`/patients/${segment(patientId)}/follow-up`, { signal }),
    }),
  overdue: () =>
    queryOptions({
      queryKey: followUpKeys.overdue(),
      queryFn: ({ signal }: Fetching) =>
        api.get<{ visits: OverdueVisit[] }>('/follow-up/overdue', { signal }),
    }),
  outcomes: (query: OutcomesQuery) =>
    queryOptions({
      queryKey: followUpKeys.outcomes(query),
      queryFn: ({ signal }: Fetching) =>
        api.get<OutcomesAnswer>(`/outcomes${searchQuery(query)}`, { signal }),
    }),
};

export function searchQuery(query: OutcomesQuery): string {
  const search = searchOf(query);
  return search ? `?${search}` : '';
}

export const recordVisit = (visitId: number, body: RecordVisit) =>
  api.post<{ visit: FollowUpVisit; working: string }>(
    `/follow-up-visits/${segment(visitId)}`,
    body,
  );

export const addComplication = (body: RecordComplication) =>
  api.post<{ complication: ComplicationRow }>('/complications', body);

export const attachToVisit = (visitId: number, file: File) => {
  const form = new FormData();
  form.append('file', file);
  return api.upload<{ attachment: { id: number; fileName: string } }>(
    `/follow-up-visits/${segment(visitId)}/attachments`,
    form,
  );
};
