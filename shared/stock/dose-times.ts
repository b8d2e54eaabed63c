/**
 * When one booked dose must be ready. The slot's time is when the light starts; the infusion
 * starts the protocol's light-start offset before it, and the drug must be in hand then. Made up
 * earlier than the infusion's end minus the beyond-use time, the drug would be out of date before
 * the infusion ends.
 */
export interface DoseTiming {
  lightStartAfterInfusionStartMin: number;
  infusionMin: number;
  beyondUseH: number;
}

export interface DoseTimes {
  /** Infusion start: the drug must be ready, and this is the latest safe reconstitution time. */
  readyBy: Date;
  infusionEndAt: Date;
  /** Made up before this, the drug passes its beyond-use time before the infusion ends. */
  earliestReconstitutionAt: Date;
}

export function doseTimes(slotStartsAt: Date, timing: DoseTiming): DoseTimes {
  const readyBy = new Date(
    slotStartsAt.getTime() - timing.lightStartAfterInfusionStartMin * 60_000,
  );
  const infusionEndAt = new Date(readyBy.getTime() + timing.infusionMin * 60_000);
  return {
    readyBy,
    infusionEndAt,
    earliestReconstitutionAt: new Date(infusionEndAt.getTime() - timing.beyondUseH * 3_600_000),
  };
}
