import { useState } from 'react';
import type { ProtocolVersion, StepKind } from '../../../../shared/protocol/protocol-schema';
import type { SessionClock } from '../../../../shared/session/session-clock';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { useLateEntry } from '../hooks/use-late-entry';
import type { EventBody } from '../hooks/use-session-events';
import { formatWardTime, stepNames } from './clock-format';
import { lateEntryInstant } from './late-entry-time';
import { formatUnitTime } from '../../../../shared/format/figures';
import type { SessionFacts } from './session-facts';

const dropKinds: ReadonlySet<StepKind> = new Set(['soak', 'uv', 'swelling']);
const readingKinds: ReadonlySet<StepKind> = new Set(['thickness', 'swelling']);

interface Choice {
  value: string;
  label: string;
  body: EventBody | { type: 'thickness-measured'; stepId: string };
}

/** What may have been missed: a drop or reading in a step that ran, the end of the running step, the start of the next. */
function choicesFor(protocol: ProtocolVersion, clock: SessionClock, facts: SessionFacts): Choice[] {
  const choices: Choice[] = [];
  const current = clock.current;
  for (const step of protocol.steps) {
    const ran = facts.replay.runs.has(step.id);
    if (!ran) continue;
    const name = stepNames[step.kind];
    const running = current?.id === step.id;
    const when = running ? 'the running' : 'the ended';
    if (dropKinds.has(step.kind) && step.cueEveryS !== undefined)
      choices.push({
        value: `drop:${step.id}`,
        label: `A drop given in ${when} ${name}`,
        body: { type: 'drop-given', stepId: step.id },
      });
    if (readingKinds.has(step.kind))
      choices.push({
        value: `reading:${step.id}`,
        label: `A thickness reading in ${when} ${name}`,
        body: { type: 'thickness-measured', stepId: step.id },
      });
    if (running)
      choices.push({
        value: `end:${step.id}`,
        label: `The end of the ${name}`,
        body: { type: 'step-ended', stepId: step.id },
      });
  }
  if (clock.next)
    choices.push({
      value: `start:${clock.next.id}`,
      label: `The start of the ${stepNames[clock.next.kind]}`,
      body: { type: 'step-started', stepId: clock.next.id },
    });
  return choices;
}

type Errors = Partial<Record<'what' | 'time' | 'thickness' | 'reason', string>>;

/**
 * A tap the nurse missed, entered afterwards at the time it really happened and with the reason
 * it is late. The server checks the time against the session and its steps; the dose record,
 * the review and the printed record list it as a late entry.
 */
export function LateEntryDialog({
  open,
  orderId,
  protocol,
  clock,
  facts,
  serverNowMs,
  onDismiss,
  onRecorded,
}: {
  open: boolean;
  orderId: number;
  protocol: ProtocolVersion;
  clock: SessionClock;
  facts: SessionFacts;
  serverNowMs: number;
  onDismiss: () => void;
  onRecorded: (text: string) => void;
}) {
  const choices = choicesFor(protocol, clock, facts);
  const [what, setWhat] = useState('');
  const [time, setTime] = useState('');
  const [thickness, setThickness] = useState('');
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<Errors>({});
  const send = useLateEntry(orderId);
  const chosen = choices.find((choice) => choice.value === what);
  const startedMs = facts.replay.sessionStartedMs;
  // A session that crossed midnight: say which day a typed time is read on, before it is sent.
  const crossedMidnight =
    startedMs !== null &&
    formatUnitTime(new Date(startedMs).toISOString(), unitTimeZone, 'date') !==
      formatUnitTime(new Date(serverNowMs).toISOString(), unitTimeZone, 'date');
  const typed = lateEntryInstant(time, { nowMs: serverNowMs, startedMs, zone: unitTimeZone });

  const close = () => {
    setWhat('');
    setTime('');
    setThickness('');
    setReason('');
    setErrors({});
    send.reset();
    onDismiss();
  };

  const submit = () => {
    const found: Errors = {};
    if (!chosen) found.what = 'Choose what was missed.';
    const read = lateEntryInstant(time, { nowMs: serverNowMs, startedMs, zone: unitTimeZone });
    const atMs = read.ok ? read.atMs : null;
    if (!read.ok)
      found.time =
        read.problem === 'unreadable'
          ? 'Enter the time it happened as HH:MM or HH:MM:SS (ward clock).'
          : read.problem === 'future'
            ? 'The time is in the future: enter when it happened.'
            : `The time is before the session started (${startedMs !== null ? formatUnitTime(new Date(startedMs).toISOString(), unitTimeZone, 'record') : ''}).`;
    let thicknessUm: number | null = null;
    if (chosen?.body.type === 'thickness-measured') {
      thicknessUm = Number(thickness.trim().replace(',', '.'));
      if (
        thickness.trim() === '' ||
        !Number.isFinite(thicknessUm) ||
        thicknessUm < 100 ||
        thicknessUm > 900
      )
        found.thickness = 'Enter the reading as a number from 100 to 900 µm.';
    }
    const trimmed = reason.trim();
    if (trimmed.length < 5 || trimmed.length > 500)
      found.reason = `Give the reason it is entered late, 5 to 500 characters (now ${trimmed.length}).`;
    setErrors(found);
    if (Object.keys(found).length > 0 || !chosen || atMs === null) return;
    const body: EventBody =
      chosen.body.type === 'thickness-measured'
        ? { type: 'thickness-measured', stepId: chosen.body.stepId, thicknessUm: thicknessUm ?? 0 }
        : chosen.body;
    send.mutate(
      { body, atMs, reason: trimmed },
      {
        onSuccess: () => {
          const text = `Late entry recorded: ${chosen.label.toLowerCase()} at ${formatWardTime(atMs)}.`;
          close();
          onRecorded(text);
        },
      },
    );
  };

  return (
    <Dialog
      open={open}
      onDismiss={close}
      dismissible={!send.isPending}
      title="Record a missed tap"
      description="Enter what happened at the time it really happened. It is kept as a late entry with your reason, and the auditor sees it as one."
    >
      <SelectField
        label="What was missed"
        value={what}
        error={errors.what}
        onChange={(event) => setWhat(event.target.value)}
      >
        <option value="">Choose…</option>
        {choices.map((choice) => (
          <option key={choice.value} value={choice.value}>
            {choice.label}
          </option>
        ))}
      </SelectField>
      <TextField
        label="When it happened (ward clock)"
        hint={`HH:MM or HH:MM:SS; not before the session started${startedMs !== null ? ` (${formatUnitTime(new Date(startedMs).toISOString(), unitTimeZone, 'record')})` : ''} and not in the future.${crossedMidnight ? ' The session crossed midnight: a time after now is read as the evening before.' : ''}`}
        inputMode="numeric"
        autoComplete="off"
        value={time}
        error={errors.time}
        onChange={(event) => setTime(event.target.value)}
      />
      {crossedMidnight && typed.ok && (
        <p className="numerals-steady -mt-2 text-paper-800" aria-live="polite">
          Read as {formatUnitTime(new Date(typed.atMs).toISOString(), unitTimeZone, 'sheet')}.
        </p>
      )}
      {chosen?.body.type === 'thickness-measured' && (
        <TextField
          label="Thinnest stromal thickness (µm)"
          inputMode="decimal"
          autoComplete="off"
          value={thickness}
          error={errors.thickness}
          onChange={(event) => setThickness(event.target.value)}
        />
      )}
      <TextAreaField
        label="Why is it entered late?"
        hint="5 to 500 characters; it goes into the record and to the auditor."
        value={reason}
        error={errors.reason}
        maxLength={500}
        onChange={(event) => setReason(event.target.value)}
      />
      {send.isError && (
        <p role="alert" className="font-medium text-alarm-700">
          The server did not take it: {describeError(send.error)}
        </p>
      )}
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={close} disabled={send.isPending}>
          Go back
        </Button>
        <Button onClick={submit} busy={send.isPending}>
          Record late entry
        </Button>
      </div>
    </Dialog>
  );
}
