import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { CheckCircleIcon, CrossCircleIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { devicesQuery, lensesQuery, type Device } from '../../../lib/queries/devices';
import { formatFigure } from '../../step-clock/components/clock-format';

const kindWords = { laser: 'Laser', uv: 'UV source' } as const;

function rangeText(device: Device): string {
  const r = (range: { min: number; max: number } | null, unit: string) =>
    range ? `${formatFigure(range.min, 1)}–${formatFigure(range.max, 1)} ${unit}` : null;
  return [
    r(device.powerRangeMw, 'mW'),
    r(device.spotRangeUm, 'µm'),
    r(device.irradianceRangeMwPerCm2, 'mW/cm²'),
    device.pulsedAvailable ? 'pulsed on/off' : null,
  ]
    .filter(Boolean)
    .join(' · ');
}

/** Whether a device may start a session now, in words and an icon (never by colour alone). */
export function ReadinessText({ device }: { device: Device }) {
  return device.blocks.length === 0 ? (
    <span className="flex items-center gap-1.5 text-iris-800">
      <CheckCircleIcon className="size-5" /> Ready: checked today
    </span>
  ) : (
    <span className="flex items-start gap-1.5 text-alarm-700">
      <CrossCircleIcon className="size-5 shrink-0" />
      <span>{device.blocks.map((b) => b.message).join(' ')}</span>
    </span>
  );
}

/** The device register and the lens register. */
export function DevicesScreen() {
  const devices = useQuery(devicesQuery());
  const lenses = useQuery(lensesQuery());
  return (
    <>
      <PageHeader
        title="Devices"
        lead="Each laser and UV source, its output checks and whether it may start a session today; the contact lenses and their laser-spot factors."
      />
      {devices.isError && (
        <Alert tone="error" title="The devices could not be loaded">
          {describeError(devices.error)}
        </Alert>
      )}
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Devices on the register</caption>
        <thead>
          <tr className="border-b border-paper-300">
            <th scope="col" className="py-2 pr-4">
              Device
            </th>
            <th scope="col" className="py-2 pr-4">
              Kind
            </th>
            <th scope="col" className="py-2 pr-4">
              Serial · location
            </th>
            <th scope="col" className="py-2 pr-4">
              Can be set to
            </th>
            <th scope="col" className="py-2 pr-4">
              Service due
            </th>
            <th scope="col" className="py-2">
              Today
            </th>
          </tr>
        </thead>
        <tbody>
          {(devices.data ?? []).map((d) => (
            <tr key={d.id} className="border-b border-paper-200 align-top">
              <td className="py-2 pr-4 font-medium">
                <Link className="underline" to={paths.device.getHref(d.id)}>
                  {d.name}
                </Link>
                {d.status === 'out-of-service' && (
                  <span className="block text-sm">Out of service: {d.outOfServiceReason}</span>
                )}
              </td>
              <td className="py-2 pr-4">
                {kindWords[d.kind]}, {formatFigure(d.wavelengthNm, 0)} nm
              </td>
              <td className="py-2 pr-4">
                {d.serialNumber} · {d.location}
              </td>
              <td className="py-2 pr-4">{rangeText(d)}</td>
              <td className="py-2 pr-4">{d.serviceDueOn}</td>
              <td className="py-2">
                <ReadinessText device={d} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>

      <h2 className="mt-8 mb-2 text-xl font-semibold text-paper-950">Contact lenses</h2>
      <p className="mb-2 text-paper-700">
        The laser-spot factor turns the retinal spot into the laser&apos;s setting: device spot =
        retinal spot ÷ factor. The image magnification is shown apart and is never used for the
        spot.
      </p>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Contact lenses on the register</caption>
        <thead>
          <tr className="border-b border-paper-300">
            <th scope="col" className="py-2 pr-4">
              Lens
            </th>
            <th scope="col" className="py-2 pr-4">
              Laser-spot factor
            </th>
            <th scope="col" className="py-2">
              Image magnification (not for the spot)
            </th>
          </tr>
        </thead>
        <tbody>
          {(lenses.data ?? []).map((l) => (
            <tr key={l.id} className="border-b border-paper-200">
              <td className="py-2 pr-4">{l.name}</td>
              <td className="py-2 pr-4">× {formatFigure(l.laserSpotFactor, 2)}</td>
              <td className="py-2">× {formatFigure(l.imageMagnification, 2)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
