import { describe, expect, it } from 'vitest';
import { protocolVersionSchema, type ProtocolVersion } from '../../shared/protocol/protocol-schema';
import { copyOf, loadProtocol } from './support/shipped-protocols';

const pdt = loadProtocol('pdt-standard');
const cxl = loadProtocol('cxl-standard');

/** The schema's complaints about a protocol changed by `change`, as "path: message" lines. */
function complaintsAbout(
  base: ProtocolVersion,
  change: (protocol: ProtocolVersion) => void,
): string[] {
  const protocol = copyOf(base);
  change(protocol);
  const result = protocolVersionSchema.safeParse(protocol);
  return result.success
    ? []
    : result.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
}

describe('the protocol schema', () => {
  it('accepts the shipped PDT and CXL protocols unchanged', () => {
    expect(complaintsAbout(pdt, () => {})).toEqual([]);
    expect(complaintsAbout(cxl, () => {})).toEqual([]);
  });

  it('refuses a PDT protocol without a drug or timing block', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      protocol.drug = null;
      protocol.timing = null;
    });

    expect(complaints).toContain('drug: drug is required for a pdt protocol');
    expect(complaints).toContain('timing: timing is required for a pdt protocol');
  });

  it('refuses a CXL protocol without its cxl block, or with a drug', () => {
    const complaints = complaintsAbout(cxl, (protocol) => {
      protocol.cxl = null;
      protocol.drug = copyOf(pdt.drug);
    });

    expect(complaints).toContain('cxl: cxl is required for a cxl protocol');
    expect(complaints).toContain('drug: drug must be null for a cxl protocol');
  });

  it('refuses irradiance × exposure more than 1% away from the target fluence', () => {
    // 600 mW/cm² × 83 s = 49.8 J/cm² is within 1% of 50 (TAP Study Group, Arch Ophthalmol 1999); 90 s is not.
    const complaints = complaintsAbout(pdt, (protocol) => {
      protocol.light.exposureS = 90;
      const lightStep = protocol.steps.find((step) => step.kind === 'light');
      if (lightStep) lightStep.durationS = 90;
    });

    expect(complaints).toEqual([
      'light.exposureS: light.irradianceMwPerCm2 × light.exposureS gives 54 J/cm², more than 1% from light.targetFluenceJPerCm2 (50 J/cm²)',
    ]);
  });

  it('refuses a soft range that reaches outside the hard range', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      protocol.inputLimits.heightCm.soft.max = 240;
    });

    expect(complaints).toEqual([
      'inputLimits.heightCm.soft: the soft range must lie inside the hard range',
    ]);
  });

  it('refuses a lesion limit that would let the spot exceed the largest spot', () => {
    // TAP Study Group, Arch Ophthalmol 1999: GLD up to 5400 µm, spot up to 6400 µm.
    const complaints = complaintsAbout(pdt, (protocol) => {
      if (protocol.inputLimits.lesionGldUm) protocol.inputLimits.lesionGldUm.hard.max = 6000;
    });

    expect(complaints).toEqual([
      expect.stringMatching(
        /^inputLimits\.lesionGldUm\.hard\.max: .* exceeds light\.maxSpotUm \(6400 µm\)$/,
      ),
    ]);
  });

  it('refuses a concentration that the vial and its reconstituted volume do not give', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      if (protocol.drug) protocol.drug.concentrationMgPerMl = 2.5;
    });

    expect(complaints).toContainEqual(expect.stringMatching(/^drug\.concentrationMgPerMl: /));
  });

  it('refuses step durations that do not match the infusion and the light start', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      const waitStep = protocol.steps.find((step) => step.kind === 'wait');
      if (waitStep) waitStep.durationS = 240;
    });

    expect(complaints).toEqual([
      expect.stringContaining(
        'must add up to timing.lightStartAfterInfusionStartMin × 60 = 900 s (they give 840 s)',
      ),
    ]);
  });

  it('refuses a CXL uv step that does not last the elapsed UV time', () => {
    const complaints = complaintsAbout(cxl, (protocol) => {
      protocol.light.pulse = { onS: 1, offS: 1 };
    });

    expect(complaints).toEqual([
      expect.stringContaining('the uv step must last the elapsed UV time 3600 s'),
    ]);
  });

  it('refuses a swelling step in a protocol that does not allow swelling', () => {
    const complaints = complaintsAbout(cxl, (protocol) => {
      if (protocol.cxl) {
        protocol.cxl.swellingAllowed = false;
        protocol.cxl.swellingDropIntervalS = null;
        protocol.cxl.swellingRiboflavin = null;
      }
    });

    expect(complaints).toEqual([
      expect.stringContaining('a swelling step needs cxl.swellingAllowed to be true'),
    ]);
  });

  it('refuses unknown fields, a single approver and a key that is not kebab-case', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      (protocol as Record<string, unknown>)['colour'] = 'red';
      protocol.approval!.approvedBy = ['Dr Ines Quillfeather (demo)'];
      protocol.key = 'PDT_Standard';
    });

    expect(complaints).toEqual(
      expect.arrayContaining([
        expect.stringContaining('colour'),
        'approval.approvedBy: approval.approvedBy must name at least two people (two-person approval)',
        'key: key must be kebab-case (lower-case letters, digits, single hyphens)',
      ]),
    );
  });

  it('refuses steps of the other kind of treatment', () => {
    const complaints = complaintsAbout(pdt, (protocol) => {
      protocol.steps.push({ id: 'soak', kind: 'soak', title: 'Soak', durationS: 60 });
    });

    expect(complaints).toContain(
      'steps.5.kind: a pdt protocol cannot have a soak step (allowed: check, infusion, wait, light, aftercare)',
    );
  });
});
