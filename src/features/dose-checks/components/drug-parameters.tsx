import type { ProtocolDrugParameters } from '../api/get-protocol-drug';
import { withoutSourceMarks } from '../../../../shared/protocol/source-marks';
import { quantity } from './display-format';

/** The protocol version's drug figures, rounding steps and check tolerances: the rest of the sum. */
export function DrugParameters({ protocol }: { protocol: ProtocolDrugParameters }) {
  const { drug, rounding, tolerances } = protocol.definition;
  if (!drug) {
    return <p className="text-paper-800">This protocol version has no drug.</p>;
  }
  const rows: [string, string][] = [
    ['Dose per BSA', quantity(drug.doseMgPerM2, 'mg/m²')],
    ['Concentration after reconstitution', quantity(drug.concentrationMgPerMl, 'mg/mL')],
    ['Vial content', quantity(drug.vialContentMg, 'mg')],
    [
      'Reconstitution',
      `${quantity(drug.reconstitutionVolumeMl, 'mL')} ${drug.reconstitutionFluid}, giving ${quantity(drug.reconstitutedVolumeMl, 'mL')}`,
    ],
    ['Final infusion volume', quantity(drug.finalVolumeMl, 'mL')],
    ['Diluent', withoutSourceMarks(drug.diluent)],
    ['Infusion time', quantity(drug.infusionMin, 'min')],
    ['Use within', `${quantity(drug.beyondUseH, 'h')} of reconstitution`],
  ];
  const check = tolerances.doseCheck;
  return (
    <section
      aria-labelledby="drug-parameters-heading"
      className="rounded-2xl border border-paper-200 bg-white px-6 py-5"
    >
      <h2 id="drug-parameters-heading" className="text-lg font-semibold text-paper-950">
        The protocol’s drug figures
      </h2>
      <p className="text-sm text-paper-700">
        {protocol.title}, version {protocol.version}
      </p>
      <dl className="mt-3 grid grid-cols-[minmax(0,11rem)_1fr] gap-x-5 gap-y-2">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-paper-700">{label}</dt>
            <dd className="numerals-steady text-paper-950">{value}</dd>
          </div>
        ))}
      </dl>
      <h3 className="mt-4 font-semibold text-paper-900">Rounding</h3>
      <p className="numerals-steady text-paper-800">
        BSA to {quantity(rounding.bsaM2, 'm²')}; dose to {quantity(rounding.doseMg, 'mg')};{' '}
        {drug.syringeGraduationMl !== undefined ? (
          <>
            drug volume to the syringe graduation, {quantity(drug.syringeGraduationMl, 'mL')}; other
            volumes
          </>
        ) : (
          'volumes'
        )}{' '}
        to {quantity(rounding.volumesMl, 'mL')}; rate to {quantity(rounding.rateMlPerMin, 'mL/min')}
        .
      </p>
      {drug.withdrawableVolumeMlPerVial !== undefined && (
        <p className="numerals-steady text-paper-800">
          Vials are counted from the drug volume at{' '}
          {quantity(drug.withdrawableVolumeMlPerVial, 'mL')} withdrawable per vial.
        </p>
      )}
      {check && (
        <>
          <h3 className="mt-4 font-semibold text-paper-900">How close your figures must be</h3>
          <p className="numerals-steady text-paper-800">
            Within ±{quantity(check.bsaPct, '%')} for BSA, ±{quantity(check.dosePct, '%')} for the
            dose and ±{quantity(check.drugVolumePct, '%')} for the drug volume, against the plan.
          </p>
        </>
      )}
    </section>
  );
}
