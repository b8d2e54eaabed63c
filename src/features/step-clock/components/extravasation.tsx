import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { LeakIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { useStoredDraft } from '../hooks/use-stored-draft';
import { formatWardTime } from './clock-format';
import { readFigure } from './entered-figures';

/** The volume the pump shows as infused, bounded by the bag's final volume; the server refuses a stop or extravasation without it. */
export function VolumeInfusedField({
  text,
  onChange,
  error,
  finalVolumeMl,
}: {
  text: string;
  onChange: (text: string) => void;
  error: string | undefined;
  finalVolumeMl: number;
}) {
  return (
    <TextField
      label="Volume infused, as the pump shows it (mL)"
      hint={`0 to ${finalVolumeMl} mL. The record shows the milligrams given from it.`}
      inputMode="decimal"
      autoComplete="off"
      value={text}
      error={error}
      onChange={(event) => onChange(event.target.value)}
    />
  );
}

/** Reads the volume field; the error names the range. */
export function readVolumeInfused(text: string, finalVolumeMl: number) {
  return readFigure(text, 'volumeInfusedMl', 'the volume infused', 'mL', finalVolumeMl);
}

const extravasationActions = [
  'Stop the infusion now.',
  'Apply a cool compress.',
  'Protect the area from light.',
];

function ActionList() {
  return (
    <ol className="list-decimal space-y-1 pl-6 text-xl font-semibold">
      {extravasationActions.map((action) => (
        <li key={action}>{action}</li>
      ))}
    </ol>
  );
}

/**
 * Extravasation: the cautions come first and large; the tap is timed at the moment the button
 * was pressed, not when the note is finished.
 */
export function ExtravasationDialog({
  open,
  draftKey,
  finalVolumeMl,
  onDismiss,
  onRecord,
}: {
  open: boolean;
  draftKey: string;
  finalVolumeMl: number;
  onDismiss: () => void;
  onRecord: (note: string | undefined, volumeInfusedMl: number) => void;
}) {
  const [note, setNote, clearNote] = useStoredDraft(draftKey, '');
  const [volumeText, setVolumeText] = useState('');
  const [volumeError, setVolumeError] = useState<string | undefined>();
  const id = useId();
  return (
    <Dialog
      open={open}
      onDismiss={onDismiss}
      title="Extravasation"
      description="The infusion has leaked into the tissue around the cannula."
    >
      <div className="rounded-xl border-2 border-alarm-700 bg-alarm-50 px-4 py-3 text-paper-950">
        <ActionList />
        <p className="mt-2 text-sm">Local policy and licensed practice prevail.</p>
      </div>
      <VolumeInfusedField
        text={volumeText}
        onChange={setVolumeText}
        error={volumeError}
        finalVolumeMl={finalVolumeMl}
      />
      <div className="flex flex-col gap-1.5">
        <label htmlFor={id} className="font-medium text-paper-900">
          Note (optional)
        </label>
        <textarea
          id={id}
          rows={2}
          maxLength={500}
          value={note}
          onChange={(event) => setNote(event.target.value)}
          className="w-full rounded-lg border border-paper-500 bg-white px-3 py-2 text-base text-paper-950"
        />
      </div>
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onDismiss}>
          Go back
        </Button>
        <Button
          variant="danger"
          icon={<LeakIcon />}
          onClick={() => {
            const volume = readVolumeInfused(volumeText, finalVolumeMl);
            if ('error' in volume) {
              setVolumeError(volume.error);
              return;
            }
            setVolumeError(undefined);
            setVolumeText('');
            const trimmed = note.trim();
            clearNote();
            onRecord(trimmed === '' ? undefined : trimmed, volume.value);
          }}
        >
          Record extravasation
        </Button>
      </div>
    </Dialog>
  );
}

/** Shown at the top of the clock from the moment extravasation is recorded until the session ends. */
export function ExtravasationNotice({ atMs }: { atMs: number }) {
  return (
    <div
      role="alert"
      className="flex items-start gap-3 rounded-xl border-2 border-alarm-700 bg-alarm-50 px-4 py-2 text-paper-950"
    >
      <LeakIcon className="mt-0.5 size-7 shrink-0 text-alarm-700" />
      <div>
        <p className="text-lg font-bold">Extravasation recorded at {formatWardTime(atMs)}</p>
        <ul className="flex flex-wrap gap-x-5 font-semibold">
          {extravasationActions.map((action) => (
            <li key={action}>{action}</li>
          ))}
        </ul>
      </div>
    </div>
  );
}
