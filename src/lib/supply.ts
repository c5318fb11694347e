/**
 * The supply against the motor [docs/engineering.md, supply]: can the source start the motor, and does a
 * controller sharing it survive the start? Pure; the shape is also the answer of POST /api/calc/supply.
 */
import type { Check, Verdict } from './checks.ts';

export interface SupplyReport {
  verdict: Verdict;
  /** supply-running-current, supply-start-current, logic-brownout, supply-motor-voltage: each only when its inputs are given. */
  checks: Check[];
  startCurrentA: number;
  startActualCurrentA: number;
  sourceVoltageAtStartV: number;
  startTorqueNm: number;
  runningCurrentA: number;
  bulkCapacitanceF: number | null;
  notes: string[];
}
