import { useQuery } from '@tanstack/react-query';
import { formatUnitTime } from '../../../../shared/format/figures';
import { Alert } from '../../../components/ui/alert';
import { CheckCircleIcon, CrossCircleIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { deviceQuery, type OutputCheck } from '../../../lib/queries/devices';
import { formatFigure } from '../../step-clock/components/clock-format';
import { ReadinessText } from './devices-screen';

/**
 * Measured ÷ set over time, as plain SVG: one point per check (a cross for a failed one, a dot for
 * a pass), the band of the tolerance shaded, 100 % marked. Oldest on the left.
 */
function CheckChart({ checks }: { checks: OutputCheck[] }) {
  const points = [...checks].reverse();
  if (points.length === 0) return null;
  const width = 640;
  const height = 200;
  const pad = 36;
  const tolerance = Math.max(...points.map((c) => c.tolerancePct));
  const lowest = Math.min(80, ...points.map((c) => 100 + c.differencePct - 2));
  const highest = Math.max(120, ...points.map((c) => 100 + c.differencePct + 2));
  const y = (pct: number) => pad / 2 + ((highest - pct) / (highest - lowest)) * (height - pad);
  const x = (i: number) =>
    pad + (points.length === 1 ? 0 : (i / (points.length - 1)) * (width - pad * 1.5));
  const title = `Measured as a percentage of the value set, ${points.length} checks from ${formatUnitTime(points[0]!.checkedAt, unitTimeZone, 'date')} to ${formatUnitTime(points[points.length - 1]!.checkedAt, unitTimeZone, 'date')}; tolerance ± ${tolerance} %.`;
  return (
    <figure className="my-4">
      <svg
        role="img"
        aria-label={title}
        viewBox={`0 0 ${width} ${height}`}
        className="w-full max-w-3xl rounded-lg border border-paper-300 bg-white"
      >
        <rect
          x={pad}
          width={width - pad * 1.5}
          y={y(100 + tolerance)}
          height={y(100 - tolerance) - y(100 + tolerance)}
          className="fill-paper-100"
        />
        <line x1={pad} x2={width - pad / 2} y1={y(100)} y2={y(100)} className="stroke-paper-500" />
        {[100 + tolerance, 100, 100 - tolerance].map((pct) => (
          <text key={pct} x={2} y={y(pct) + 4} className="fill-paper-800 text-[11px]">
            {formatFigure(pct, 0)} %
          </text>
        ))}
        <polyline
          fill="none"
          className="stroke-iris-700"
          strokeWidth={1.5}
          points={points.map((c, i) => `${x(i)},${y(100 + c.differencePct)}`).join(' ')}
        />
        {points.map((c, i) =>
          c.passed ? (
            <circle
              key={c.id}
              cx={x(i)}
              cy={y(100 + c.differencePct)}
              r={3.5}
              className="fill-iris-700"
            />
          ) : (
            <g key={c.id} className="stroke-alarm-700" strokeWidth={2}>
              <line
                x1={x(i) - 5}
                x2={x(i) + 5}
                y1={y(100 + c.differencePct) - 5}
                y2={y(100 + c.differencePct) + 5}
              />
              <line
                x1={x(i) - 5}
                x2={x(i) + 5}
                y1={y(100 + c.differencePct) + 5}
                y2={y(100 + c.differencePct) - 5}
              />
            </g>
          ),
        )}
      </svg>
      <figcaption className="mt-1 text-sm text-paper-700">
        {title} A dot is a pass, a cross a failed check; the shaded band is the tolerance.
      </figcaption>
    </figure>
  );
}

/** One device: its facts, whether it may start a session today, its checks (chart and table) and its versions. */
export function DeviceDetailScreen({ deviceId }: { deviceId: number }) {
  const detail = useQuery(deviceQuery(deviceId));
  if (detail.isError)
    return (
      <Alert tone="error" title="The device could not be loaded">
        {describeError(detail.error)}
      </Alert>
    );
  if (!detail.data) return <p>Loading the device…</p>;
  const { device, checks, versions } = detail.data;
  return (
    <>
      <PageHeader
        title={device.name}
        lead={`${device.kind === 'laser' ? 'Laser' : 'UV source'}, ${formatFigure(device.wavelengthNm, 0)} nm · serial ${device.serialNumber} · ${device.location} · service due ${device.serviceDueOn}`}
      />
      <ReadinessText device={device} />
      <h2 className="mt-6 text-xl font-semibold text-paper-950">Output checks</h2>
      <CheckChart checks={checks} />
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Output checks of {device.name}, newest first</caption>
        <thead>
          <tr className="border-b border-paper-300">
            <th scope="col" className="py-2 pr-3">
              When
            </th>
            <th scope="col" className="py-2 pr-3">
              Set
            </th>
            <th scope="col" className="py-2 pr-3">
              Measured
            </th>
            <th scope="col" className="py-2 pr-3">
              Difference
            </th>
            <th scope="col" className="py-2 pr-3">
              Result
            </th>
            <th scope="col" className="py-2 pr-3">
              Meter (calibration due)
            </th>
            <th scope="col" className="py-2">
              By
            </th>
          </tr>
        </thead>
        <tbody>
          {checks.map((c) => (
            <tr key={c.id} className="border-b border-paper-200 align-top">
              <td className="py-1.5 pr-3 numerals-steady">
                {formatUnitTime(c.checkedAt, unitTimeZone, 'record')}
              </td>
              <td className="py-1.5 pr-3">
                {formatFigure(c.setValue, 2)} {c.unit}
              </td>
              <td className="py-1.5 pr-3">
                {formatFigure(c.measuredValue, 2)} {c.unit}
              </td>
              <td className="py-1.5 pr-3">
                {c.differencePct >= 0 ? '+' : ''}
                {formatFigure(c.differencePct, 1)} % (± {formatFigure(c.tolerancePct, 0)} %)
              </td>
              <td className="py-1.5 pr-3">
                {c.passed ? (
                  <span className="flex items-center gap-1">
                    <CheckCircleIcon className="size-4" /> Pass
                  </span>
                ) : (
                  <span className="flex items-center gap-1 font-semibold">
                    <CrossCircleIcon className="size-4" /> Fail
                  </span>
                )}
                {c.note && <span className="block text-sm">{c.note}</span>}
              </td>
              <td className="py-1.5 pr-3">
                {c.meterIdentity} ({c.meterCalibrationDueOn})
              </td>
              <td className="py-1.5">{c.checkedByName ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <h2 className="mt-6 text-xl font-semibold text-paper-950">Versions kept</h2>
      <ol className="list-decimal pl-6">
        {versions.map((v) => (
          <li key={v.version}>
            Version {v.version}, {formatUnitTime(v.changedAt, unitTimeZone, 'record')} by{' '}
            {v.changedByName ?? 'unknown'}: {String(v.snapshot.reason ?? '')}
            {v.snapshot.status === 'out-of-service'
              ? ` (out of service: ${String(v.snapshot.outOfServiceReason)})`
              : ''}
          </li>
        ))}
      </ol>
    </>
  );
}
