import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { CheckCircleIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { readFigure } from './entered-figures';
import { formatQuantity } from '../../../../shared/format/figures';

/**
 * At the end of the light step the nurse copies what the laser displays: the exposure time (the
 * figure the exposure is judged on) and the energy when the device shows it. The taps' own
 * difference stays in the record as information.
 */
export function ExposureDialog({
  open,
  plannedS,
  onDismiss,
  onRecord,
}: {
  open: boolean;
  plannedS: number;
  onDismiss: () => void;
  onRecord: (figures: { exposureS: number; energyJ?: number }) => void;
}) {
  const [exposureText, setExposureText] = useState('');
  const [energyText, setEnergyText] = useState('');
  const [errors, setErrors] = useState<{ exposure?: string; energy?: string }>({});

  const confirm = () => {
    const exposure = readFigure(exposureText, 'exposureS', 'the exposure time', 's');
    const energy =
      energyText.trim() === '' ? null : readFigure(energyText, 'energyJ', 'the energy', 'J');
    const next = {
      exposure: 'error' in exposure ? exposure.error : undefined,
      energy: energy && 'error' in energy ? energy.error : undefined,
    };
    setErrors(next);
    if ('error' in exposure || (energy && 'error' in energy)) return;
    setExposureText('');
    setEnergyText('');
    onRecord({ exposureS: exposure.value, ...(energy ? { energyJ: energy.value } : {}) });
  };

  return (
    <Dialog
      open={open}
      onDismiss={onDismiss}
      title="Exposure the laser displays"
      description={`Copy the figures from the laser's display. The plan is ${formatQuantity(plannedS, 's')}; the record judges the exposure on the laser's figure.`}
    >
      <form
        className="flex flex-col gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          confirm();
        }}
      >
        <TextField
          label="Exposure time on the laser (s)"
          inputMode="decimal"
          autoComplete="off"
          value={exposureText}
          error={errors.exposure}
          onChange={(event) => setExposureText(event.target.value)}
        />
        <TextField
          label="Energy on the laser (J), if it shows one"
          inputMode="decimal"
          autoComplete="off"
          value={energyText}
          error={errors.energy}
          onChange={(event) => setEnergyText(event.target.value)}
        />
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={onDismiss}>
            Later
          </Button>
          <Button type="submit" icon={<CheckCircleIcon />}>
            Record exposure
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
