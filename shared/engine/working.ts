import type { WorkingEntry } from '../schemas/calculation';
import { roundToStep } from './rounding';

export type Quantity = { value: number; unit: string };

export interface WorkingStep {
  name: string;
  value: number;
  unit: string;
  formula: string;
  inputs: Record<string, Quantity>;
  source: string;
  /** The protocol's rounding step for this value, when it has one. */
  step?: number;
}

/**
 * Records one line of working and returns the value the plan carries on with: the rounded
 * value when a step applies, so that every later line can be repeated by hand from the
 * figures printed above it.
 */
export function record(working: WorkingEntry[], line: WorkingStep): number {
  const entry: WorkingEntry = {
    name: line.name,
    value: line.value,
    unit: line.unit,
    formula: line.formula,
    inputs: line.inputs,
    source: line.source,
  };
  if (line.step !== undefined)
    entry.rounded = { value: roundToStep(line.value, line.step), step: line.step };
  working.push(entry);
  return entry.rounded?.value ?? entry.value;
}
