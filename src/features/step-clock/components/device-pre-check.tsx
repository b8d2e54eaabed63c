import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import type { DeviceSetting } from '../../../../shared/schemas/devices';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { api, describeError, isApiRequestError } from '../../../lib/api-client';
import {
  deviceKeys,
  devicesQuery,
  lensesQuery,
  recordedCheckSchema,
  type Device,
} from '../../../lib/queries/devices';
import { formatFigure, formatWardTime } from './clock-format';

/** What the nurse has chosen and typed: the device and its settings, as the session start sends them. */
export type DeviceChoice = { setting: DeviceSetting | null; ready: boolean };

const numberOrUndefined = (text: string) => {
  const value = Number(text.replace(',', '.'));
  return text.trim() === '' || !Number.isFinite(value) ? undefined : value;
};

/**
 * The device for this session, on the step clock's pre-checks: pick the laser or UV source, record
 * its output check (the server judges it against the protocol's tolerance), and type what is set
 * on it; for a laser, the contact lens (the order's, or one named here whose laser-spot factor is
 * the plan's). Large fields for a tablet; the server refuses a start the device rules do not allow.
 */
export function DevicePreCheck({
  orderId,
  protocol,
  plan,
  lens,
  onChange,
}: {
  orderId: number;
  protocol: ProtocolVersion;
  plan: DosePlan;
  /** The order's lens from the register (if it picked one) and the laser-spot factor of its plan. */
  lens: { id: number | undefined; laserSpotFactor: number | null };
  onChange: (choice: DeviceChoice) => void;
}) {
  const headingId = useId();
  const kind = protocol.kind === 'pdt' ? 'laser' : 'uv';
  const devices = useQuery(devicesQuery());
  const queryClient = useQueryClient();
  const [deviceId, setDeviceId] = useState<number | null>(null);
  const [powerSet, setPowerSet] = useState('');
  const [spotSet, setSpotSet] = useState('');
  const [irradianceSet, setIrradianceSet] = useState('');
  const [checkSet, setCheckSet] = useState('');
  const [checkMeasured, setCheckMeasured] = useState('');
  const [meter, setMeter] = useState('');
  const [meterDue, setMeterDue] = useState('');
  const [verdict, setVerdict] = useState<string | null>(null);
  const [lensId, setLensId] = useState<number | null>(null);
  const lenses = useQuery({ ...lensesQuery(), enabled: kind === 'laser' });
  const orderLens = lenses.data?.find((l) => l.id === lens.id);
  // Lenses that fit the plan: those with its laser-spot factor (the spot was worked out with it).
  const fitting = (lenses.data ?? []).filter(
    (l) => l.active && l.laserSpotFactor === lens.laserSpotFactor,
  );

  const ofKind = (devices.data ?? []).filter((d) => d.kind === kind);
  const device: Device | undefined = ofKind.find((d) => d.id === deviceId);
  const unit = kind === 'laser' ? 'mW' : 'mW/cm²';
  const spotPlanned =
    (protocol.deviceChecks?.laserSpotSetting ?? 'device-spot') === 'device-spot'
      ? plan.deviceSpotDiameterUm
      : plan.spotDiameterUm;

  const settingFrom = (next: {
    deviceId: number | null;
    powerSet: string;
    spotSet: string;
    irradianceSet: string;
    lensId: number | null;
  }): DeviceSetting | null => {
    if (next.deviceId === null) return null;
    return kind === 'laser'
      ? {
          deviceId: next.deviceId,
          powerSetMw: numberOrUndefined(next.powerSet),
          spotSetUm: numberOrUndefined(next.spotSet),
          ...(lens.id === undefined && next.lensId !== null ? { lensId: next.lensId } : {}),
        }
      : { deviceId: next.deviceId, irradianceSetMwPerCm2: numberOrUndefined(next.irradianceSet) };
  };
  const tell = (
    next: Partial<{
      deviceId: number | null;
      powerSet: string;
      spotSet: string;
      irradianceSet: string;
      lensId: number | null;
    }>,
    readyNow?: boolean,
  ) => {
    const merged = { deviceId, powerSet, spotSet, irradianceSet, lensId, ...next };
    const chosen = ofKind.find((d) => d.id === merged.deviceId);
    onChange({
      setting: settingFrom(merged),
      ready: readyNow ?? (chosen !== undefined && chosen.blocks.length === 0),
    });
  };

  const record = useMutation({
    mutationFn: () =>
      api.post(
        `/devices/${deviceId}/output-checks`,
        {
          ...(kind === 'laser'
            ? {
                powerSetMw: numberOrUndefined(checkSet),
                powerMeasuredMw: numberOrUndefined(checkMeasured),
              }
            : {
                irradianceSetMwPerCm2: numberOrUndefined(checkSet),
                irradianceMeasuredMwPerCm2: numberOrUndefined(checkMeasured),
              }),
          meterIdentity: meter,
          meterCalibrationDueOn: meterDue,
          orderId,
        },
        { schema: recordedCheckSchema },
      ),
    onSuccess: async (result) => {
      const c = result.check;
      setVerdict(
        `${c.passed ? 'Passed' : 'Failed'}: ${formatFigure(c.measuredValue, 2)} ${c.unit} read against ${formatFigure(c.setValue, 2)} ${c.unit} set (${c.differencePct >= 0 ? '+' : ''}${formatFigure(c.differencePct, 1)} %, tolerance ± ${formatFigure(c.tolerancePct, 0)} %).`,
      );
      await queryClient.invalidateQueries({ queryKey: deviceKeys.all() });
      tell({}, result.blocks.length === 0);
    },
  });
  const fieldError = (path: string) =>
    isApiRequestError(record.error)
      ? record.error.fields.find((f) => f.path.endsWith(path))?.message
      : undefined;

  return (
    <section
      aria-labelledby={headingId}
      className="flex flex-col gap-3 rounded-2xl border-2 border-paper-400 bg-white px-5 py-4"
    >
      <h2 id={headingId} className="text-xl font-semibold text-paper-950">
        {kind === 'laser' ? 'Laser' : 'UV source'} and its output check
      </h2>
      <SelectField
        label={kind === 'laser' ? 'Laser used' : 'UV source used'}
        value={deviceId ?? ''}
        className="text-lg"
        onChange={(event) => {
          const id = event.target.value === '' ? null : Number(event.target.value);
          const chosen = ofKind.find((d) => d.id === id);
          setDeviceId(id);
          setVerdict(null);
          setMeter(chosen?.lastCheck?.meterIdentity ?? '');
          setMeterDue(chosen?.lastCheck?.meterCalibrationDueOn ?? '');
          tell({ deviceId: id });
        }}
      >
        <option value="">Choose…</option>
        {ofKind.map((d) => (
          <option key={d.id} value={d.id}>
            {d.name} — {d.blocks.length === 0 ? 'ready' : 'cannot start yet'}
          </option>
        ))}
      </SelectField>
      {devices.isError && (
        <Alert tone="error" title="The devices could not be loaded">
          {describeError(devices.error)}
        </Alert>
      )}
      {device && device.blocks.length > 0 && (
        <Alert tone="error" title={`${device.name} cannot start a session`} live="none">
          <ul className="list-disc pl-5">
            {device.blocks.map((b) => (
              <li key={b.kind}>{b.message}</li>
            ))}
          </ul>
        </Alert>
      )}
      {device && device.blocks.length === 0 && device.lastCheck && (
        <p className="text-paper-800">
          Output check passed at {formatWardTime(Date.parse(device.lastCheck.checkedAt), false)}:{' '}
          {formatFigure(device.lastCheck.measuredValue, 2)} {device.lastCheck.unit} read against{' '}
          {formatFigure(device.lastCheck.setValue, 2)} {device.lastCheck.unit} set.
        </p>
      )}
      {device && (
        <fieldset className="flex flex-col gap-3 rounded-xl border border-paper-300 px-4 py-3">
          <legend className="px-1 font-semibold text-paper-950">Record an output check</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField
              label={`Value set (${unit})`}
              inputMode="decimal"
              value={checkSet}
              onChange={(e) => setCheckSet(e.target.value)}
              error={fieldError(kind === 'laser' ? 'powerSetMw' : 'irradianceSetMwPerCm2')}
            />
            <TextField
              label={`Meter reading (${unit})`}
              hint={kind === 'uv' ? 'At the treatment distance' : 'At the laser aperture'}
              inputMode="decimal"
              value={checkMeasured}
              onChange={(e) => setCheckMeasured(e.target.value)}
              error={fieldError(
                kind === 'laser' ? 'powerMeasuredMw' : 'irradianceMeasuredMwPerCm2',
              )}
            />
            <TextField
              label="Meter identity"
              value={meter}
              onChange={(e) => setMeter(e.target.value)}
              error={fieldError('meterIdentity')}
            />
            <TextField
              label="Meter calibration due (YYYY-MM-DD)"
              value={meterDue}
              onChange={(e) => setMeterDue(e.target.value)}
              error={fieldError('meterCalibrationDueOn')}
            />
          </div>
          <Button
            variant="secondary"
            className="min-h-14 text-lg"
            busy={record.isPending}
            onClick={() => record.mutate()}
          >
            Record output check
          </Button>
          {verdict && (
            <p role="status" className="font-semibold text-paper-950">
              {verdict}
            </p>
          )}
          {record.isError && !isApiRequestError(record.error) && (
            <Alert tone="error" title="The check was not recorded">
              {describeError(record.error)}
            </Alert>
          )}
        </fieldset>
      )}
      {device && kind === 'laser' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField
            label="Power set on the laser (mW)"
            hint={`Plan: ${formatFigure(plan.powerMw ?? 0, 1)} mW`}
            inputMode="decimal"
            value={powerSet}
            onChange={(e) => {
              setPowerSet(e.target.value);
              tell({ powerSet: e.target.value });
            }}
          />
          <TextField
            label="Spot set on the laser (µm)"
            hint={`Plan: ${formatFigure(spotPlanned ?? 0, 0)} µm${lens.laserSpotFactor !== null ? ` — lens laser-spot factor × ${formatFigure(lens.laserSpotFactor, 2)}` : ''}`}
            inputMode="decimal"
            value={spotSet}
            onChange={(e) => {
              setSpotSet(e.target.value);
              tell({ spotSet: e.target.value });
            }}
          />
        </div>
      )}
      {device && kind === 'laser' && lens.id !== undefined && (
        <p className="text-paper-800">
          Contact lens (from the order): {orderLens?.name ?? `lens ${lens.id} of the register`},
          laser-spot factor × {formatFigure(lens.laserSpotFactor ?? 0, 2)}.
        </p>
      )}
      {device && kind === 'laser' && lens.id === undefined && (
        <>
          <SelectField
            label="Contact lens on the eye"
            hint={`The plan's spot was worked out with a laser-spot factor of × ${formatFigure(lens.laserSpotFactor ?? 0, 2)}: only lenses with that factor are offered.`}
            value={lensId ?? ''}
            className="text-lg"
            onChange={(event) => {
              const id = event.target.value === '' ? null : Number(event.target.value);
              setLensId(id);
              tell({ lensId: id });
            }}
          >
            <option value="">Choose…</option>
            {fitting.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name} — laser-spot factor × {formatFigure(l.laserSpotFactor, 2)}
              </option>
            ))}
          </SelectField>
          {lenses.isSuccess && fitting.length === 0 && (
            <Alert tone="error" title="No lens on the register fits this plan" live="none">
              No lens in use has the plan’s laser-spot factor of ×{' '}
              {formatFigure(lens.laserSpotFactor ?? 0, 2)}. Ask the clinician to choose a lens on
              the order, or the device lead to add the lens.
            </Alert>
          )}
        </>
      )}
      {device && kind === 'uv' && (
        <TextField
          label="Irradiance set on the UV source (mW/cm²)"
          hint={`Plan: ${formatFigure(plan.irradianceMwPerCm2 ?? 0, 1)} mW/cm²`}
          inputMode="decimal"
          value={irradianceSet}
          onChange={(e) => {
            setIrradianceSet(e.target.value);
            tell({ irradianceSet: e.target.value });
          }}
        />
      )}
    </section>
  );
}
