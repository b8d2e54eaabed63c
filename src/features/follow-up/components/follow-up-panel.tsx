import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { PlanInputError } from '../../../../shared/engine/plan-input-error';
import {
  acuityFromEntry,
  acuityNotationLabels,
  acuityNotations,
  type AcuityNotation,
} from '../../../../shared/engine/visual-acuity';
import {
  complicationOutcomes,
  complicationSeverities,
  followUpRanges,
  type RecordVisit,
} from '../../../../shared/schemas/follow-up';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  addComplication,
  attachToVisit,
  followUpKeys,
  followUpQueries,
  recordVisit,
  type FollowUpTreatment,
  type FollowUpVisit,
} from '../api/follow-up-queries';

const stateWords: Record<FollowUpVisit['state'], string> = {
  recorded: 'Recorded',
  planned: 'Planned',
  due: 'Due today',
  overdue: 'Overdue',
  missed: 'Missed (lost to follow-up)',
};
const stateMarks: Record<FollowUpVisit['state'], string> = {
  recorded: '✓',
  planned: '○',
  due: '●',
  overdue: '!',
  missed: '✕',
};

function fieldErrors(error: unknown): Record<string, string> {
  if (!isApiRequestError(error)) return {};
  return Object.fromEntries(error.fields.map((f) => [f.path, f.message]));
}

function findingsText(visit: FollowUpVisit): string {
  if (visit.pdt) {
    const p = visit.pdt;
    return `CST ${p.centralSubfieldThicknessUm} µm · subretinal fluid ${p.subretinalFluid} · leakage ${p.leakage} · decision: ${p.retreatmentDecision}`;
  }
  if (visit.cxl) {
    const c = visit.cxl;
    return `Kmax ${c.kmaxD?.toFixed(1)} D · thinnest ${c.thinnestPachymetryUm} µm · ECC ${c.endothelialCellsPerMm2 ?? 'not measured'}${c.endothelialCellsPerMm2 ? ' cells/mm²' : ''} · haze grade ${c.hazeGrade}`;
  }
  return '';
}

function VisitForm({
  visit,
  today,
  onDone,
}: {
  visit: FollowUpVisit;
  today: string;
  onDone: () => void;
}) {
  const queryClient = useQueryClient();
  const [seenOn, setSeenOn] = useState(visit.dueOn <= today ? visit.dueOn : today);
  const [notation, setNotation] = useState<AcuityNotation>('snellen-m');
  const [value, setValue] = useState('');
  const [pdt, setPdt] = useState({
    centralSubfieldThicknessUm: '',
    subretinalFluid: 'present',
    leakage: 'not-done',
    retreatmentDecision: 'observe',
  });
  const [cxl, setCxl] = useState({
    kmaxD: '',
    thinnestPachymetryUm: '',
    endothelialCellsPerMm2: '',
    hazeGrade: '0',
  });
  const [note, setNote] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const noValue = notation === 'counting-fingers' || notation === 'hand-motion';

  let preview: string | null = null;
  if (noValue || value.trim() !== '') {
    try {
      const a = acuityFromEntry({ notation, value: noValue ? '' : value });
      preview = `${a.working} · ${a.letters} letters`;
    } catch (error) {
      preview = error instanceof PlanInputError ? (error.fields[0]?.message ?? null) : null;
    }
  }

  const numberOrNaN = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));
  const mutation = useMutation({
    mutationFn: async () => {
      const body: RecordVisit = {
        seenOn,
        acuity: { notation, value: noValue ? '' : value },
        note: note.trim() || null,
        ...(visit.kind === 'pdt'
          ? {
              pdt: {
                centralSubfieldThicknessUm: numberOrNaN(pdt.centralSubfieldThicknessUm),
                subretinalFluid: pdt.subretinalFluid as 'present' | 'resolved',
                leakage: pdt.leakage as 'none' | 'present' | 'not-done',
                retreatmentDecision: pdt.retreatmentDecision as 'retreat' | 'observe' | 'discharge',
              },
            }
          : {
              cxl: {
                kmaxD: numberOrNaN(cxl.kmaxD),
                thinnestPachymetryUm: numberOrNaN(cxl.thinnestPachymetryUm),
                endothelialCellsPerMm2:
                  cxl.endothelialCellsPerMm2.trim() === ''
                    ? null
                    : Number(cxl.endothelialCellsPerMm2),
                hazeGrade: Number(cxl.hazeGrade),
              },
            }),
      };
      const saved = await recordVisit(visit.id, body);
      if (file) await attachToVisit(visit.id, file);
      return saved;
    },
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: followUpKeys.all() });
      onDone();
    },
  });
  const errors = fieldErrors(mutation.error);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    mutation.mutate();
  };
  const r = followUpRanges;
  return (
    <form
      onSubmit={submit}
      aria-label={`Record the ${visit.label} visit`}
      className="grid gap-4 rounded-xl border border-paper-300 bg-paper-50 p-4"
      noValidate
    >
      <h4 className="text-lg font-semibold text-paper-950">Record the {visit.label} visit</h4>
      {mutation.isError && (
        <Alert tone="error" title="The visit was not recorded">
          {describeError(mutation.error)}
        </Alert>
      )}
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Seen on"
          type="date"
          value={seenOn}
          max={today}
          onChange={(e) => setSeenOn(e.target.value)}
          error={errors.seenOn}
          required
        />
        <SelectField
          label="Acuity written as"
          value={notation}
          onChange={(e) => setNotation(e.target.value as AcuityNotation)}
          error={errors['acuity.notation']}
        >
          {acuityNotations.map((n) => (
            <option key={n} value={n}>
              {acuityNotationLabels[n]}
            </option>
          ))}
        </SelectField>
        <TextField
          label={visit.kind === 'cxl' ? 'Corrected acuity' : 'Best-corrected acuity'}
          hint={noValue ? 'No figure: the category is the entry.' : 'As written in the notes'}
          value={noValue ? '' : value}
          disabled={noValue}
          onChange={(e) => setValue(e.target.value)}
          error={errors['acuity.value']}
        />
      </div>
      <p className="text-sm text-paper-700" aria-live="polite">
        {preview ? `Stored as: ${preview}` : 'Type the acuity to see it in logMAR.'}
      </p>
      {visit.kind === 'pdt' ? (
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <TextField
            label="Central subfield thickness (µm)"
            inputMode="numeric"
            hint={`${r.centralSubfieldThicknessUm.min} to ${r.centralSubfieldThicknessUm.max} µm`}
            value={pdt.centralSubfieldThicknessUm}
            onChange={(e) => setPdt({ ...pdt, centralSubfieldThicknessUm: e.target.value })}
            error={errors['pdt.centralSubfieldThicknessUm'] ?? errors.pdt}
          />
          <SelectField
            label="Subretinal fluid"
            value={pdt.subretinalFluid}
            onChange={(e) => setPdt({ ...pdt, subretinalFluid: e.target.value })}
          >
            <option value="present">Present</option>
            <option value="resolved">Resolved</option>
          </SelectField>
          <SelectField
            label="Leakage on angiography"
            value={pdt.leakage}
            onChange={(e) => setPdt({ ...pdt, leakage: e.target.value })}
          >
            <option value="not-done">Not done</option>
            <option value="none">None</option>
            <option value="present">Present</option>
          </SelectField>
          <SelectField
            label="Retreatment decision"
            value={pdt.retreatmentDecision}
            onChange={(e) => setPdt({ ...pdt, retreatmentDecision: e.target.value })}
          >
            <option value="observe">Observe</option>
            <option value="retreat">Retreat</option>
            <option value="discharge">Discharge</option>
          </SelectField>
        </div>
      ) : (
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <TextField
            label="Kmax (D)"
            inputMode="decimal"
            hint={`${r.kmaxD.min} to ${r.kmaxD.max} D`}
            value={cxl.kmaxD}
            onChange={(e) => setCxl({ ...cxl, kmaxD: e.target.value })}
            error={errors['cxl.kmaxD'] ?? errors.cxl}
          />
          <TextField
            label="Thinnest pachymetry (µm)"
            inputMode="numeric"
            hint={`${r.thinnestPachymetryUm.min} to ${r.thinnestPachymetryUm.max} µm`}
            value={cxl.thinnestPachymetryUm}
            onChange={(e) => setCxl({ ...cxl, thinnestPachymetryUm: e.target.value })}
            error={errors['cxl.thinnestPachymetryUm']}
          />
          <TextField
            label="Endothelial cell count (cells/mm²)"
            inputMode="numeric"
            hint="Leave empty when not measured"
            value={cxl.endothelialCellsPerMm2}
            onChange={(e) => setCxl({ ...cxl, endothelialCellsPerMm2: e.target.value })}
            error={errors['cxl.endothelialCellsPerMm2']}
          />
          <SelectField
            label="Haze grade (0 clear to 4 dense)"
            value={cxl.hazeGrade}
            onChange={(e) => setCxl({ ...cxl, hazeGrade: e.target.value })}
          >
            {[0, 1, 2, 3, 4].map((g) => (
              <option key={g} value={g}>
                {g}
              </option>
            ))}
          </SelectField>
        </div>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Note (optional)"
          value={note}
          onChange={(e) => setNote(e.target.value)}
          error={errors.note}
        />
        <TextField
          label="Report (OCT or topography; PDF, PNG or JPEG, optional)"
          type="file"
          accept="application/pdf,image/png,image/jpeg"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
      </div>
      <div className="flex gap-3">
        <Button type="submit" busy={mutation.isPending}>
          Record visit
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function ComplicationForm({
  treatment,
  today,
  onDone,
}: {
  treatment: FollowUpTreatment;
  today: string;
  onDone: () => void;
}) {
  const queryClient = useQueryClient();
  const [kind, setKind] = useState(treatment.complicationKinds[0]?.id ?? '');
  const [severity, setSeverity] = useState<(typeof complicationSeverities)[number]>('mild');
  const [onsetOn, setOnsetOn] = useState(today);
  const [outcome, setOutcome] = useState<(typeof complicationOutcomes)[number]>('resolving');
  const [visitId, setVisitId] = useState('');
  const [note, setNote] = useState('');
  const mutation = useMutation({
    mutationFn: () =>
      addComplication({
        orderId: treatment.orderId,
        followUpVisitId: visitId ? Number(visitId) : null,
        kind,
        severity,
        onsetOn,
        outcome,
        note: note.trim() || null,
      }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: followUpKeys.all() });
      onDone();
    },
  });
  const errors = fieldErrors(mutation.error);
  return (
    <form
      aria-label="Record a complication"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        mutation.mutate();
      }}
      className="grid gap-4 rounded-xl border border-paper-300 bg-paper-50 p-4"
    >
      <h4 className="text-lg font-semibold text-paper-950">Record a complication</h4>
      {mutation.isError && (
        <Alert tone="error" title="The complication was not saved">
          {describeError(mutation.error)}
        </Alert>
      )}
      <div className="grid gap-4 sm:grid-cols-3">
        <SelectField
          label="Kind"
          value={kind}
          onChange={(e) => setKind(e.target.value)}
          error={errors.kind}
        >
          {treatment.complicationKinds.map((k) => (
            <option key={k.id} value={k.id}>
              {k.label}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Severity"
          value={severity}
          onChange={(e) => setSeverity(e.target.value as typeof severity)}
        >
          {complicationSeverities.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Onset"
          type="date"
          value={onsetOn}
          max={today}
          onChange={(e) => setOnsetOn(e.target.value)}
          error={errors.onsetOn}
        />
        <SelectField
          label="Outcome so far"
          value={outcome}
          onChange={(e) => setOutcome(e.target.value as typeof outcome)}
        >
          {complicationOutcomes.map((o) => (
            <option key={o} value={o}>
              {o.replace(/-/g, ' ')}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Seen at visit (optional)"
          value={visitId}
          onChange={(e) => setVisitId(e.target.value)}
          error={errors.followUpVisitId}
        >
          <option value="">Not at a visit (the session itself)</option>
          {treatment.visits.map((v) => (
            <option key={v.id} value={v.id}>
              {v.label}
            </option>
          ))}
        </SelectField>
        <TextField label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} />
      </div>
      <div className="flex gap-3">
        <Button type="submit" busy={mutation.isPending}>
          Save complication
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function TreatmentFollowUp({
  treatment,
  today,
  canRecord,
}: {
  treatment: FollowUpTreatment;
  today: string;
  canRecord: boolean;
}) {
  const [recording, setRecording] = useState<number | null>(null);
  const [addingComplication, setAddingComplication] = useState(false);
  const headingId = `follow-up-${treatment.orderId}`;
  const visit = treatment.visits.find((v) => v.id === recording);
  return (
    <section aria-labelledby={headingId} className="rounded-2xl border border-paper-200 bg-white">
      <div className="border-b border-paper-200 px-5 py-3">
        <h3 id={headingId} className="text-lg font-semibold text-paper-950">
          {treatment.eye === 'right' ? 'Right eye' : 'Left eye'} · {treatment.protocol.title} ·
          treated {treatment.treatedOn}
        </h3>
        <p className="text-sm text-paper-700">
          Order {treatment.orderId}
          {treatment.sessionOutcome === 'stopped' && ' · session stopped early'}
          {treatment.outcomeLabel && ` · outcome measured: ${treatment.outcomeLabel}`}
          {treatment.planFrom &&
            treatment.planFrom.version !== treatment.protocol.version &&
            ` · visits planned from version ${treatment.planFrom.version}`}
        </p>
      </div>
      {treatment.visits.length === 0 ? (
        <p className="px-5 py-4 text-paper-700">
          No follow-up visits are planned for this session.
        </p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Follow-up visits of order {treatment.orderId}</caption>
            <thead className="text-sm text-paper-700">
              <tr>
                <th scope="col" className="px-5 py-2 font-medium">
                  Visit
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Due
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  State
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Acuity
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Findings
                </th>
                <th scope="col" className="px-5 py-2 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {treatment.visits.map((v) => (
                <tr key={v.id} className="border-t border-paper-200 align-top">
                  <th scope="row" className="px-5 py-3 font-medium text-paper-950">
                    {v.label}
                  </th>
                  <td className="whitespace-nowrap px-3 py-3">{v.dueOn}</td>
                  <td className="px-3 py-3">
                    <span aria-hidden="true">{stateMarks[v.state]} </span>
                    {stateWords[v.state]}
                    {v.seenOn && (
                      <span className="block text-sm text-paper-700">seen {v.seenOn}</span>
                    )}
                  </td>
                  <td className="px-3 py-3">
                    {v.acuity ? (
                      <>
                        <span className="font-medium">logMAR {v.acuity.logMar.toFixed(2)}</span>
                        <span className="block text-sm text-paper-700">
                          entered {v.acuity.entry} · {v.acuity.letters} letters
                        </span>
                      </>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className="px-3 py-3 text-sm">
                    {findingsText(v) || '—'}
                    {v.note && <span className="block text-paper-700">{v.note}</span>}
                    {v.attachments.map((a) => (
                      <a
                        key={a.id}
                        className="block text-iris-800 underline"
                        href={`/api/attachments/${a.id}`}
                      >
                        {a.fileName}
                      </a>
                    ))}
                  </td>
                  <td className="px-5 py-3">
                    {canRecord && v.state !== 'recorded' && (
                      <Button
                        size="sm"
                        variant="secondary"
                        className="whitespace-nowrap"
                        onClick={() => setRecording(v.id)}
                      >
                        Record {v.label}
                      </Button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {visit && (
        <div className="px-5 py-4">
          <VisitForm visit={visit} today={today} onDone={() => setRecording(null)} />
        </div>
      )}
      <div className="border-t border-paper-200 px-5 py-4">
        <h4 className="mb-2 font-semibold text-paper-950">Complications</h4>
        {treatment.complications.length === 0 ? (
          <p className="text-paper-700">None recorded.</p>
        ) : (
          <ul className="mb-3 grid gap-2">
            {treatment.complications.map((c) => (
              <li key={c.id} className="rounded-lg border border-paper-200 px-3 py-2">
                <strong>{c.kindLabel}</strong> · {c.severity} · onset {c.onsetOn} ·{' '}
                {c.outcome.replace(/-/g, ' ')}
                {c.note && <span className="block text-sm text-paper-700">{c.note}</span>}
                <span className="block text-sm text-paper-700">
                  {c.reviewedAt ? 'Seen by the auditor' : 'Waiting for the auditor'}
                </span>
              </li>
            ))}
          </ul>
        )}
        {canRecord && treatment.complicationKinds.length > 0 && !addingComplication && (
          <Button size="sm" variant="secondary" onClick={() => setAddingComplication(true)}>
            Record a complication
          </Button>
        )}
        {addingComplication && (
          <ComplicationForm
            treatment={treatment}
            today={today}
            onDone={() => setAddingComplication(false)}
          />
        )}
      </div>
    </section>
  );
}

/** The follow-up of every ended treatment of one patient: visits, acuity in logMAR, complications. */
export function FollowUpPanel({ patientId, canRecord }: { patientId: number; canRecord: boolean }) {
  const query = useQuery(followUpQueries.patient(patientId));
  return (
    <section aria-labelledby="follow-up-heading" className="mt-8">
      <h2 id="follow-up-heading" className="mb-2 text-xl font-semibold text-paper-950">
        Follow-up and complications
      </h2>
      <p className="mb-4 text-sm text-paper-700">
        Visits are planned from the protocol when a session completes. Acuity is kept as written and
        stored as logMAR (−log10 of the decimal acuity; ETDRS letters ≈ 85 − 50 × logMAR).
      </p>
      {query.isPending ? (
        <p className="text-paper-700">Loading the follow-up…</p>
      ) : query.isError ? (
        <Alert tone="error" title="The follow-up could not be loaded">
          {describeError(query.error)}
        </Alert>
      ) : query.data.treatments.length === 0 ? (
        <p className="text-paper-700">No completed or stopped sessions yet.</p>
      ) : (
        <div className="grid gap-6">
          {query.data.treatments.map((t) => (
            <TreatmentFollowUp
              key={t.orderId}
              treatment={t}
              today={query.data.today}
              canRecord={canRecord}
            />
          ))}
        </div>
      )}
    </section>
  );
}
