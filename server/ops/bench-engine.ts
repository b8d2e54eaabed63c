// Measures how many dose plans one core computes per second, for one PDT and one CXL protocol.
// Run: npx tsx server/ops/bench-engine.ts [seconds per protocol, default 3]
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { computePlan } from '../../shared/engine/compute-plan';
import { engineVersion } from '../../shared/engine/engine-version';
import { protocolVersionSchema, type ProtocolVersion } from '../../shared/protocol/protocol-schema';
import type { PlanInputs } from '../../shared/schemas/calculation';

const protocolsDir = fileURLToPath(new URL('../../protocols/', import.meta.url));

function loadProtocol(fileName: string): ProtocolVersion {
  return protocolVersionSchema.parse(
    JSON.parse(readFileSync(`${protocolsDir}${fileName}`, 'utf8')),
  );
}

export interface EngineResult {
  label: string;
  plansPerSecond: number;
}

function bench(
  label: string,
  protocol: ProtocolVersion,
  inputsFor: (i: number) => PlanInputs,
  seconds: number,
): EngineResult {
  // Warm up so the JIT has compiled the hot path before timing starts.
  for (let i = 0; i < 2000; i += 1) computePlan(protocol, inputsFor(i));
  const deadline = performance.now() + seconds * 1000;
  let plans = 0;
  let checksum = 0;
  const started = performance.now();
  while (performance.now() < deadline) {
    for (let i = 0; i < 200; i += 1) {
      // Varying inputs keep the engine from seeing one constant case; the checksum keeps the work observable.
      checksum += computePlan(protocol, inputsFor(plans + i)).working.length;
    }
    plans += 200;
  }
  const elapsedS = (performance.now() - started) / 1000;
  console.log(
    `${label.padEnd(28)} ${Math.round(plans / elapsedS)
      .toLocaleString('en-GB')
      .padStart(9)} plans/s  (${plans} plans in ${elapsedS.toFixed(2)} s, checksum ${checksum})`,
  );
  return { label, plansPerSecond: Math.round(plans / elapsedS) };
}

/** Plans per second on this one core, for one PDT and one CXL protocol. */
export function measureEngine(seconds: number): EngineResult[] {
  console.log(
    `engine ${engineVersion}, Node ${process.version}, one core, ${seconds} s per protocol`,
  );
  return [
    bench(
      'pdt-standard v1',
      loadProtocol('pdt-standard.v1.json'),
      (i) => ({
        height: { value: 150 + (i % 40), unit: 'cm' },
        weight:
          i % 2 === 0
            ? { value: 50 + (i % 60), unit: 'kg' }
            : { value: 110 + (i % 130), unit: 'lb' },
        lesionGldUm: 1000 + (i % 4000),
        lensMagnification: 1.5,
      }),
      seconds,
    ),
    bench(
      'cxl-accelerated-pulsed v1',
      loadProtocol('cxl-accelerated-pulsed.v1.json'),
      (i) => ({
        stromalThicknessUm: 380 + (i % 200),
      }),
      seconds,
    ),
  ];
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const seconds = Number(process.argv[2] ?? 3);
  if (!(seconds > 0)) throw new Error('seconds per protocol must be a number greater than 0');
  measureEngine(seconds);
}
