import { describe, expect, it } from 'vitest';
import { bookingClash, listSlots, type BookedSlot } from '../../shared/lists/slots';
import { monthUse, preparationUse } from '../../shared/stock/drug-use';
import { doseTimes } from '../../shared/stock/dose-times';
import { planVials, vialsForDose, type PlannedDose } from '../../shared/stock/vial-plan';
import { readProtocolJson } from './support/shipped-protocols';

// The half-dose protocol file's product figures, read from the file rather than copied:
// vial content 15 mg and reconstitution to 7.5 mL (DOMAIN.md: "from memory"); 7 mL withdrawable
// per vial (the demo unit's own figure, "common practice; no source" in the file); strength
// 2 mg/mL and use within 4 h of reconstitution (review table, Drug Discov Today 2008;13:124–134);
// light 15 min after the start of a 10 min infusion (TAP Study Group, Arch Ophthalmol 1999).
const halfDose = readProtocolJson('pdt-half-dose.v2.json') as {
  drug: {
    vialContentMg: number;
    concentrationMgPerMl: number;
    withdrawableVolumeMlPerVial: number;
    beyondUseH: number;
    infusionMin: number;
  };
  timing: { lightStartAfterInfusionStartMin: number };
};
const { drug } = halfDose;

function dose(orderId: number, doseMg: number, slot: string): PlannedDose {
  return {
    orderId,
    label: `patient ${orderId}`,
    slotStartsAt: new Date(slot),
    doseMg,
    drugVolumeMl: doseMg / drug.concentrationMgPerMl,
    timing: {
      lightStartAfterInfusionStartMin: halfDose.timing.lightStartAfterInfusionStartMin,
      infusionMin: drug.infusionMin,
      beyondUseH: drug.beyondUseH,
    },
    vial: {
      vialContentMg: drug.vialContentMg,
      concentrationMgPerMl: drug.concentrationMgPerMl,
      withdrawableVolumeMlPerVial: drug.withdrawableVolumeMlPerVial,
      beyondUseH: drug.beyondUseH,
    },
  };
}

describe('the vial plan for a list', () => {
  it('reads the product figures it is worked on from the protocol file', () => {
    expect(drug.vialContentMg).toBe(15); // DOMAIN.md, from memory
    expect(drug.withdrawableVolumeMlPerVial).toBe(7); // demo unit's figure, common practice
    expect(drug.concentrationMgPerMl).toBe(2); // Drug Discov Today 2008;13:124–134
    expect(drug.beyondUseH).toBe(4); // Drug Discov Today 2008;13:124–134
  });

  // Worked by hand: 5.4 + 4.9 + 6.1 = 16.4 mg (2.7 + 2.45 + 3.05 mL at 2 mg/mL). Each dose alone
  // fits one vial (≤ 7 mL), so 3 vials unshared. Shared: vial 1 gives 2.7 + 2.45 = 5.15 mL, leaving
  // 1.85 mL (3.7 mg) — too little for 3.05 mL — so vial 2 is opened for the third patient.
  const list = [
    dose(1, 5.4, '2027-01-12T09:15:00Z'),
    dose(2, 4.9, '2027-01-12T09:45:00Z'),
    dose(3, 6.1, '2027-01-12T10:15:00Z'),
  ];

  it('three half-dose patients of 5.4, 4.9 and 6.1 mg need three vials when no vial is shared', () => {
    const plan = planVials(list, false);
    expect(plan.totalDoseMg).toBe(16.4);
    expect(plan.vialsUnshared).toBe(3);
    expect(plan.vialsPlanned).toBe(3);
    expect(plan.vialsSaved).toBe(0);
    expect(plan.steps.map((s) => s.vials)).toEqual([[1], [2], [3]]);
    // Each vial's 15 mg less its dose is discarded: 9.6, 10.1 and 8.9 mg.
    expect(plan.vials.map((v) => v.leftOverMg)).toEqual([9.6, 10.1, 8.9]);
  });

  it('need two vials shared within the 4 h beyond-use time, the second opened for the third patient', () => {
    const plan = planVials(list, true);
    expect(plan.vialsPlanned).toBe(2);
    expect(plan.vialsSaved).toBe(1);
    expect(plan.steps.map((s) => [s.orderId, s.vials, s.fromSharedVial])).toEqual([
      [1, [1], false],
      [2, [1], true],
      [3, [2], false],
    ]);
    expect(plan.vials[0]!.drawnMl).toBe(5.15);
    // 15 − 10.3 mg left in vial 1, 15 − 6.1 mg in vial 2.
    expect(plan.vials.map((v) => v.leftOverMg)).toEqual([4.7, 8.9]);
    // Prepared in order of the time each dose must be ready: 15 min before its light (TAP 1999).
    expect(plan.steps.map((s) => s.readyBy.toISOString())).toEqual([
      '2027-01-12T09:00:00.000Z',
      '2027-01-12T09:30:00.000Z',
      '2027-01-12T10:00:00.000Z',
    ]);
  });

  it('never plans a shared vial across the beyond-use limit', () => {
    // Vial made up by 09:00 for the first patient is usable to 13:00 (4 h). A patient whose
    // infusion ends at 12:40 leaves only 20 min: inside the 30 min closing window, so not shared.
    const late = planVials(
      [dose(1, 5.4, '2027-01-12T09:15:00Z'), dose(2, 4.9, '2027-01-12T12:45:00Z')],
      true,
    );
    expect(late.vialsPlanned).toBe(2);
    expect(late.steps[1]!.fromSharedVial).toBe(false);
    // One whose infusion ends at 13:10 would be past it altogether.
    const past = planVials(
      [dose(1, 5.4, '2027-01-12T09:15:00Z'), dose(2, 4.9, '2027-01-12T13:15:00Z')],
      true,
    );
    expect(past.vialsPlanned).toBe(2);
    // Infusion ends at 12:10, 50 min before 13:00: still usable, so shared.
    const inTime = planVials(
      [dose(1, 5.4, '2027-01-12T09:15:00Z'), dose(2, 4.9, '2027-01-12T12:15:00Z')],
      true,
    );
    expect(inTime.vialsPlanned).toBe(1);
    expect(inTime.vials[0]!.reconstituteNotBefore.toISOString()).toBe('2027-01-12T08:10:00.000Z');
  });

  it('opens two vials for a dose above the withdrawable volume and shares what the second leaves', () => {
    // 15 mg = 7.5 mL > 7 mL withdrawable: two vials (the dose plan's own rule), 6.5 mL left in vial 2.
    expect(vialsForDose(7.5, drug.withdrawableVolumeMlPerVial)).toBe(2);
    const plan = planVials(
      [dose(1, 15, '2027-01-12T09:15:00Z'), dose(2, 4, '2027-01-12T09:45:00Z')],
      true,
    );
    expect(plan.steps.map((s) => s.vials)).toEqual([[1, 2], [2]]);
    expect(plan.vialsPlanned).toBe(2);
    expect(plan.vialsUnshared).toBe(3);
  });

  it('does not share between products with different figures', () => {
    const other = { ...dose(2, 4.9, '2027-01-12T09:45:00Z') };
    other.vial = { ...other.vial, vialContentMg: 20 };
    expect(planVials([dose(1, 5.4, '2027-01-12T09:15:00Z'), other], true).vialsPlanned).toBe(2);
  });
});

describe('when a dose must be ready', () => {
  it('is the slot (light) time less the light-start offset; the earliest make-up is the infusion end less the beyond-use time', () => {
    const times = doseTimes(new Date('2027-01-12T10:15:00Z'), {
      lightStartAfterInfusionStartMin: 15, // TAP Study Group, Arch Ophthalmol 1999
      infusionMin: 10, // TAP Study Group, Arch Ophthalmol 1999
      beyondUseH: 4, // Drug Discov Today 2008;13:124–134
    });
    expect(times.readyBy.toISOString()).toBe('2027-01-12T10:00:00.000Z');
    expect(times.infusionEndAt.toISOString()).toBe('2027-01-12T10:10:00.000Z');
    expect(times.earliestReconstitutionAt.toISOString()).toBe('2027-01-12T06:10:00.000Z');
  });
});

describe('slots and clashes', () => {
  it('cuts a list into whole slots in the unit’s zone, across the change to summer time', () => {
    const slots = listSlots(
      { listDate: '2027-03-28', startTime: '00:30', sessionLengthMin: 100, slotMin: 30 },
      'Europe/Lisbon',
    );
    expect(slots).toHaveLength(3);
    // Lisbon goes from UTC+0 to UTC+1 at 01:00 on 28 March 2027: 01:30 local does not exist.
    expect(slots.map((s) => s.startsAt.toISOString())).toEqual([
      '2027-03-28T00:30:00.000Z',
      '2027-03-28T01:00:00.000Z',
      '2027-03-28T01:30:00.000Z',
    ]);
  });

  const booked: BookedSlot = {
    listId: 1,
    room: 'Room A',
    slotIndex: 0,
    orderId: 10,
    patientId: 5,
    eye: 'right',
    bookingDate: '2027-01-12',
    startsAt: new Date('2027-01-12T09:00:00Z'),
    endsAt: new Date('2027-01-12T09:30:00Z'),
  };
  const candidate = {
    orderId: 11,
    patientId: 5,
    eye: 'left' as const,
    bookingDate: '2027-01-12',
    startsAt: new Date('2027-01-12T09:15:00Z'),
    endsAt: new Date('2027-01-12T09:45:00Z'),
  };
  it('finds the same patient at an overlapping time, and the same eye on the same day', () => {
    expect(bookingClash(candidate, [booked])?.kind).toBe('patient-overlap');
    const later = {
      ...candidate,
      startsAt: new Date('2027-01-12T09:30:00Z'),
      endsAt: new Date('2027-01-12T10:00:00Z'),
    };
    expect(bookingClash(later, [booked])).toBeNull();
    expect(bookingClash({ ...later, eye: 'right' }, [booked])?.kind).toBe('eye-same-day');
    expect(bookingClash({ ...later, eye: 'right', patientId: 6 }, [booked])).toBeNull();
  });
});

describe('the monthly drug use', () => {
  it('counts given, discarded and never-infused doses', () => {
    expect(preparationUse({ isLatest: false, orderStatus: 'completed' })).toBe('never-infused');
    expect(preparationUse({ isLatest: true, orderStatus: 'cancelled' })).toBe('never-infused');
    expect(preparationUse({ isLatest: true, orderStatus: 'prepared' })).toBe('pending');
    const month = monthUse('2027-01', [
      { use: 'given', doseMg: 5.4, discardedMg: 9.6, vialsIssued: 1 },
      { use: 'never-infused', doseMg: 4.9, discardedMg: 10.1, vialsIssued: 1 },
    ]);
    // given 5.4 mg; discarded 9.6 + 10.1 + 4.9 = 24.6 mg; of 30 mg: 18 % and 82 %.
    expect(month).toEqual({
      month: '2027-01',
      vialsIssued: 2,
      givenMg: 5.4,
      discardedMg: 24.6,
      givenPct: 18,
      discardedPct: 82,
      preparedNeverInfused: 1,
    });
  });
});
