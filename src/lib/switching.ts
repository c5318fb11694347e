/**
 * Gate-charge switching times and losses of a clamped inductive load [docs/engineering.md §5].
 */

/** Q_sw ≈ Q_gd + Q_gs/2; without split charges, the total gate charge (conservative). */
export function switchingChargeNc(qgTotalNc: number, qgdNc?: number | null, qgsNc?: number | null): number {
  if (qgdNc != null && qgsNc != null) return qgdNc + qgsNc / 2;
  return qgTotalNc;
}

export interface GateDriveInput {
  switchingChargeNc: number;
  driveV: number;
  plateauV: number;
  /** Gate resistor plus any driver output resistance; 0 when only the current limit applies. */
  gateResistanceOhm: number;
  sourceLimitA: number;
  sinkLimitA: number;
}

export interface SwitchingTimes {
  gateOnCurrentA: number;
  gateOffCurrentA: number;
  /** Infinite when the drive never reaches the plateau (the part never fully turns on). */
  turnOnS: number;
  turnOffS: number;
}

/** I_g,on = (V_drv − V_plateau)/R, I_g,off = V_plateau/R, each capped by the driver's source/sink rating; t = Q_sw/I_g. */
export function switchingTimes(input: GateDriveInput): SwitchingTimes {
  const chargeC = input.switchingChargeNc * 1e-9;
  const headroomV = Math.max(0, input.driveV - input.plateauV);
  const r = input.gateResistanceOhm;
  const gateOnCurrentA = Math.min(input.sourceLimitA, r > 0 ? headroomV / r : headroomV > 0 ? Infinity : 0);
  const gateOffCurrentA = Math.min(input.sinkLimitA, r > 0 ? input.plateauV / r : Infinity);
  return {
    gateOnCurrentA,
    gateOffCurrentA,
    turnOnS: gateOnCurrentA > 0 ? chargeC / gateOnCurrentA : Infinity,
    turnOffS: gateOffCurrentA > 0 ? chargeC / gateOffCurrentA : Infinity,
  };
}

/** P ≈ ½·(V + V_F)·I·(t_r + t_f)·f [docs/engineering.md §5]. */
export function switchingLossW(clampV: number, currentA: number, turnOnS: number, turnOffS: number, frequencyHz: number): number {
  if (frequencyHz <= 0) return 0;
  return 0.5 * clampV * currentA * (turnOnS + turnOffS) * frequencyHz;
}

/** P = Qg·V_drv·f, dissipated in the driver and gate resistor [docs/engineering.md §5]. */
export function gateDrivePowerW(qgTotalNc: number, driveV: number, frequencyHz: number): number {
  return qgTotalNc * 1e-9 * driveV * Math.max(0, frequencyHz);
}

/** With ripple the edges switch different currents: P ≈ ½·(V + V_F)·(I_on·t_on + I_off·t_off)·f [docs/engineering.md §4]. */
export function switchingLossAtEdgesW(
  clampV: number,
  turnOnCurrentA: number,
  turnOffCurrentA: number,
  turnOnS: number,
  turnOffS: number,
  frequencyHz: number,
): number {
  if (frequencyHz <= 0) return 0;
  const onJ = turnOnCurrentA > 0 ? turnOnCurrentA * turnOnS : 0;
  const offJ = turnOffCurrentA > 0 ? turnOffCurrentA * turnOffS : 0;
  return 0.5 * clampV * (onJ + offJ) * frequencyHz;
}
