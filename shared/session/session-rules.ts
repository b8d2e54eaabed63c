/**
 * The session's safety rules that both sides read: the server refuses a tap by them, the clock
 * shows the same rule before the tap is made. One function per rule; no I/O.
 */

/** UV starts on a stroma read at or above the protocol's minimum, or with a clinician's authorised override. */
export function uvStartVerdict(
  minimumUm: number | null,
  lastReadingUm: number | null,
  authorisedOverride: boolean,
): { allowed: true } | { allowed: false; lastReadingUm: number | null; minimumUm: number } {
  if (minimumUm === null || authorisedOverride) return { allowed: true };
  if (lastReadingUm !== null && lastReadingUm >= minimumUm) return { allowed: true };
  return { allowed: false, lastReadingUm, minimumUm };
}

/** Neither a session nor an infusion starts from a drug past its beyond-use time; an infusion never before the drug was made up. */
export function drugTimeVerdict(
  what: 'session' | 'infusion',
  atMs: number,
  preparation: { reconstitutedAt: string | null; beyondUseAt: string } | null,
): { allowed: true } | { allowed: false; rule: 'beyond_use' | 'before_reconstitution' } {
  if (preparation === null) return { allowed: true };
  if (atMs > Date.parse(preparation.beyondUseAt)) return { allowed: false, rule: 'beyond_use' };
  if (
    what === 'infusion' &&
    preparation.reconstitutedAt !== null &&
    atMs < Date.parse(preparation.reconstitutedAt)
  )
    return { allowed: false, rule: 'before_reconstitution' };
  return { allowed: true };
}

/**
 * The volume the pump shows is recorded at an extravasation, and at a PDT stop once the infusion
 * has started (unless an extravasation recorded it already).
 */
export function volumeInfusedRequired(
  type: 'extravasation' | 'session-stopped',
  facts: { infusionStarted: boolean; volumeKnown: boolean },
): boolean {
  return type === 'extravasation' || (facts.infusionStarted && !facts.volumeKnown);
}

/** A PDT session whose light step ran completes only once the laser's displayed exposure is entered. */
export function exposureMissing(facts: {
  lightStarted: boolean;
  lightRunning: boolean;
  exposureEntered: boolean;
}): boolean {
  return facts.lightStarted && !facts.lightRunning && !facts.exposureEntered;
}
