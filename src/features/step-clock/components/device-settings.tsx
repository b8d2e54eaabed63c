import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import { formatDuration } from '../../../../shared/format/figures';
import { formatFigure } from './clock-format';

interface Setting {
  label: string;
  value: string;
}

function settingsFor(
  protocol: ProtocolVersion,
  plan: DosePlan,
  lensText: string | null,
): Setting[] {
  const figure = (value: number | null, unit: string, digits = 2) =>
    value === null ? 'not in the plan' : `${formatFigure(value, digits)} ${unit}`;
  if (protocol.kind === 'pdt') {
    return [
      { label: 'Wavelength', value: `${formatFigure(protocol.light.wavelengthNm)} nm` },
      {
        label: 'Spot set on the laser',
        value:
          (protocol.deviceChecks?.laserSpotSetting ?? 'device-spot') === 'device-spot'
            ? figure(plan.deviceSpotDiameterUm, 'µm', 0)
            : figure(plan.spotDiameterUm, 'µm', 0),
      },
      ...(lensText ? [{ label: 'Lens and laser-spot factor', value: lensText }] : []),
      { label: 'Power', value: figure(plan.powerMw, 'mW', 1) },
      { label: 'Irradiance', value: figure(plan.irradianceMwPerCm2, 'mW/cm²', 1) },
      { label: 'Exposure', value: figure(plan.exposureS, 's', 0) },
      { label: 'Fluence', value: figure(plan.fluenceJPerCm2, 'J/cm²', 2) },
      { label: 'Pump rate', value: figure(plan.infusionRateMlPerMin, 'mL/min', 1) },
      {
        label: 'Infusion volume',
        value: protocol.drug
          ? `${formatFigure(protocol.drug.finalVolumeMl)} mL over ${formatFigure(protocol.drug.infusionMin)} min`
          : 'not in the protocol',
      },
    ];
  }
  const pulse = protocol.light.pulse;
  return [
    { label: 'Wavelength', value: `${formatFigure(protocol.light.wavelengthNm)} nm` },
    { label: 'Irradiance', value: figure(plan.irradianceMwPerCm2, 'mW/cm²', 1) },
    {
      label: 'UV time (light on)',
      value:
        plan.uvTimeS === null
          ? 'not in the plan'
          : formatDuration(plan.uvTimeS, 'seconds-and-words', { maxDecimals: 0 }),
    },
    {
      label: 'Pulsing',
      value: pulse
        ? `${formatFigure(pulse.onS)} s on / ${formatFigure(pulse.offS)} s off`
        : 'continuous',
    },
    ...(pulse && plan.uvElapsedS !== null
      ? [
          {
            label: 'Elapsed time with pulsing',
            value: formatDuration(plan.uvElapsedS, 'seconds-and-words', { maxDecimals: 0 }),
          },
        ]
      : []),
    { label: 'Fluence', value: figure(plan.fluenceJPerCm2, 'J/cm²', 2) },
  ];
}

/** The plan's device settings, laid out to compare with the laser or UV device's own display. */
export function DeviceSettings({
  protocol,
  plan,
  headingId,
  lensText = null,
}: {
  protocol: ProtocolVersion;
  plan: DosePlan;
  headingId: string;
  /** The order's lens and its laser-spot factor, shown beside the spot set on the laser. */
  lensText?: string | null;
}) {
  return (
    <section
      aria-labelledby={headingId}
      className="rounded-2xl border border-paper-300 bg-white px-5 py-4"
    >
      <h2 id={headingId} className="font-semibold text-paper-950">
        {protocol.kind === 'pdt'
          ? 'Laser and pump settings in the plan'
          : 'UV device settings in the plan'}
      </h2>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-6 gap-y-1.5">
        {settingsFor(protocol, plan, lensText).map((setting) => (
          <div key={setting.label} className="contents">
            <dt className="text-paper-700">{setting.label}</dt>
            <dd className="numerals-steady text-lg font-semibold text-paper-950">
              {setting.value}
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
