/**
 * Cautions shown wherever the work can hurt someone. Wording is ours; the hazards are the usual ones
 * for battery-fed motor drives (see docs/engineering.md §11).
 */
export type CautionId = 'battery' | 'stall-heat' | 'inductive-spike' | 'unexpected-start' | 'selv' | 'review';

export interface Caution {
  id: CautionId;
  title: string;
  text: string;
}

export const CAUTIONS: readonly Caution[] = [
  {
    id: 'battery',
    title: 'Batteries',
    text: 'Battery packs can deliver very large short-circuit currents. Fuse close to the pack and size the wiring for the stall current, not the running current.',
  },
  {
    id: 'stall-heat',
    title: 'Stall heat',
    text: 'At stall the switch, the diode and the motor case can pass 100 °C within seconds. Limit stall time or current, and keep fingers and plastics away from hot parts.',
  },
  {
    id: 'inductive-spike',
    title: 'Inductive spike',
    text:
      'Breaking motor current raises the switch node far above the supply. Always fit the freewheel diode ' +
      'across the motor, cathode to the positive supply; the MOSFET body diode does not do this job.',
  },
  {
    id: 'unexpected-start',
    title: 'Unexpected start',
    text: 'A wrong gate state during power-up or reset can start the motor without a command. Verify the drive stays OFF through reset before attaching loads, and guard moving shafts.',
  },
  {
    id: 'selv',
    title: 'Low voltage only',
    text: 'Stallpoint covers safety extra-low-voltage drives. Anything on the mains side belongs to qualified people working under local codes.',
  },
  {
    id: 'review',
    title: 'Engineering aid',
    text: "Results are engineering aids, not a certification. Final designs need review by a qualified engineer against the parts' own datasheets and local codes and practice.",
  },
];

export function cautionsById(ids: readonly CautionId[]): Caution[] {
  return CAUTIONS.filter((c) => ids.includes(c.id));
}
