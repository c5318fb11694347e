import type { ComponentType, ReactNode } from 'react';
import type { DesignInput, PartRole, RoleSelection } from '../../lib/domain/design.ts';
import type { DesignMatchPage } from '../../lib/match-page.ts';
import { driverSupplyRangeOf } from '../../lib/design-input.ts';
import { driversRankedForLine, switchDriveLine } from '../../lib/design-words.ts';
import { counted, measure, quantity } from '../../lib/units.ts';
import CandidateTable, { type ExtraColumn } from './CandidateTable.tsx';

type StepComponent = ComponentType<{ n: number; title: string; children: ReactNode; testId?: string }>;

type DesignMatch = DesignMatchPage;

interface Props {
  match: DesignMatch;
  /** Asks for the next page of every list. */
  onShowMore: () => void;
  input: DesignInput;
  onSelect: (role: PartRole) => (sel: RoleSelection) => void;
  readOnly: boolean;
  Step: StepComponent;
  /** The saved design the Compare buttons open against (none before the first save). */
  compare?: { designId: number; includePending: boolean; unsaved: boolean };
}

type SwitchEntry = DesignMatch['switch'][number];
type DriverEntry = DesignMatch['driver'][number];
type DiodeEntry = DesignMatch['diode'][number];

const n = (v: number | null | undefined, unit: string, scale = 1, d = 3) => (v == null ? '—' : quantity(v * scale, unit, d));
const checkValue = (e: { checks: { id: string; value: number | null; unit: string }[] }, id: string, scale = 1) => {
  const c = e.checks.find((x) => x.id === id);
  return c ? n(c.value, c.unit === 'A' && scale !== 1 ? 'mA' : c.unit, scale) : '—';
};

/** The junction with the shaft jammed; "runs away" when the RDS(on) rise with heat has no steady state. */
function stallTj(e: SwitchEntry): string {
  if (e.evaluation.stallJunctionC != null) return n(e.evaluation.stallJunctionC, '°C');
  const check = e.checks.find((c) => c.id === 'stall-thermal');
  return check && !check.ok && check.value == null ? 'runs away' : '—';
}

const SWITCH_COLS: ExtraColumn<SwitchEntry>[] = [
  { header: 'RDS(on) @ drive', cell: (e) => n(e.evaluation.rdsOnAtDriveOhms, 'mΩ', 1000) },
  { header: 'Tj', cell: (e) => n(e.evaluation.junctionC, '°C') },
  { header: 'Tj jammed', cell: stallTj },
  {
    header: 'Loss',
    cell: (e) =>
      e.evaluation.conductionLossW == null ? '—' : n(e.evaluation.conductionLossW + (e.evaluation.switchingLossW ?? 0), 'mW', 1000),
  },
];
const DRIVER_COLS: ExtraColumn<DriverEntry>[] = [
  { header: 'Output high', cell: (e) => checkValue(e, 'output-high') },
  { header: 'Polarity', cell: (e) => (e.pairing.inverting ? 'inverting' : 'non-inverting') },
  { header: 'Paired switch', cell: (e) => `${e.pairing.switchMpn} (${e.pairing.switchVerdict})` },
];
const DIODE_KIND: Readonly<Record<DiodeEntry['diode']['kind'], string>> = {
  schottky: 'Schottky',
  ultrafast: 'ultrafast',
  fast: 'fast recovery',
  general: 'general purpose',
};
/** Reverse recovery: a Schottky has none to speak of (never "0 ns"); a missing figure says so. */
function trrCell(e: DiodeEntry): string {
  if (e.diode.kind === 'schottky') return '— (Schottky)';
  return e.diode.trrNs == null ? 'not on record' : measure(e.diode.trrNs * 1e-9, 's');
}
/** The part's own figures (they differ per row); what the design asks of every diode is said once above the table. */
const DIODE_COLS: ExtraColumn<DiodeEntry>[] = [
  { header: 'Type', cell: (e) => DIODE_KIND[e.diode.kind] },
  { header: 'VF', cell: (e) => n(e.diode.vfV, 'V') },
  { header: 'IF(AV)', cell: (e) => n(e.diode.ifAvA, 'A') },
  { header: 'VRRM', cell: (e) => n(e.diode.vrrmV, 'V') },
  { header: 'trr', cell: trrCell },
];

function Line({ children, testId }: { children: ReactNode; testId: string }) {
  return (
    <p className="text-sm px-1 pb-1" data-testid={testId}>
      {children}
    </p>
  );
}

function Excluded({ count, one, many }: { count: number; one: string; many: string }) {
  if (!count) return null;
  return (
    <p className="text-xs text-ink-faint mt-1" data-testid="excluded-count">
      {counted(count, one, many)} left out before ranking: a rating or the gate drive can never pass (or the part is obsolete).
    </p>
  );
}

/** What the design asks of every diode, said once (the table shows each part's own ratings). */
function diodeNeedsLine(wc: DesignMatch['worstCase']): string {
  const block = `Every diode must block up to ${n(wc.supplyMaxV, 'V')}`;
  if (wc.pwmHz == null) return `${block}; on/off drive leaves it only the brief decay after each turn-off.`;
  return `${block} and carry ${n(wc.diodeMeanCurrentA, 'A')} mean while running, ${n(wc.stall.diodeMeanA, 'A')} with the shaft jammed.`;
}

/** Steps 4–6: switch, gate drive, freewheel diode. */
export default function CandidatesSection({ match, input, onSelect, readOnly, Step, onShowMore, compare }: Props) {
  const compareProps = (role: 'switch' | 'driver' | 'diode') =>
    compare
      ? {
          compareHref: (ids: number[]) =>
            `/designs/${compare.designId}/compare?role=${role}&ids=${ids.join(',')}${compare.includePending ? '&includePending=true' : ''}`,
          compareNote: compare.unsaved ? 'Compares the saved revision; save to include your changes.' : undefined,
        }
      : {};
  const switchKey = match.driverNeeded ? 'switchWithDriver' : 'switch';
  const switches = match[switchKey];
  const pairedSwitch = match.driver[0]?.pairing;
  return (
    <>
      <Step
        n={4}
        title={match.driverNeeded ? 'Switch (driven through a gate driver)' : 'Switch (driven straight from the logic pin)'}
        testId="step-switch"
      >
        <div className="card p-2">
          <Line testId="switch-drive">{switchDriveLine(match.switchDrive, driverSupplyRangeOf(input).minV)}</Line>
          <p className="text-xs text-ink-faint px-1 pb-1" data-testid="score-explanation">
            {match.scoreExplanation}
          </p>
          <CandidateTable
            role="switch"
            caption="Switch candidates"
            entries={switches}
            summary={match.lists[switchKey]}
            onShowMore={onShowMore}
            extra={SWITCH_COLS}
            selection={input.selections.switch}
            onSelect={onSelect('switch')}
            readOnly={readOnly}
            {...compareProps('switch')}
          />
          <Excluded count={match.excluded.switch} one="MOSFET" many="MOSFETs" />
        </div>
      </Step>
      <Step n={5} title="Gate drive" testId="step-gate-drive">
        {match.driverNeeded ? (
          <div className="card p-2">
            <p className="p-2 mb-2 rounded border border-warn bg-warn-wash text-warn text-sm" role="note" data-testid="driver-needed">
              <strong>! A gate driver is needed.</strong> {match.driverNeededNote}
            </p>
            <Line testId="driver-pairing">
              {driversRankedForLine(
                pairedSwitch?.switchMpn ?? null,
                pairedSwitch != null && pairedSwitch.switchPartId === input.selections.switch.chosenPartId,
              )}
            </Line>
            <CandidateTable
              role="driver"
              caption="Gate driver candidates"
              entries={match.driver}
              summary={match.lists.driver}
              onShowMore={onShowMore}
              extra={DRIVER_COLS}
              selection={input.selections.driver}
              onSelect={onSelect('driver')}
              readOnly={readOnly}
              {...compareProps('driver')}
            />
            <Excluded count={match.excluded.driver} one="driver" many="drivers" />
          </div>
        ) : (
          <p className="card p-3 text-sm" data-testid="direct-drive">
            ✓ Direct drive: the logic high of {match.worstCase.gateDriveMinV} V enhances the passing switches; no driver needed. Keep the
            gate trace short and add a gate resistor footprint.
          </p>
        )}
      </Step>
      <Step n={6} title="Freewheel diode" testId="step-diode">
        <div className="card p-2">
          <p className="text-xs text-ink-soft px-1 pb-1">
            ⚠ Inductive spike: fit the diode across the motor, cathode to the positive supply. The MOSFET's body diode does not do this job.
          </p>
          <Line testId="diode-needs">{diodeNeedsLine(match.worstCase)}</Line>
          <CandidateTable
            role="diode"
            caption="Diode candidates"
            entries={match.diode}
            summary={match.lists.diode}
            onShowMore={onShowMore}
            extra={DIODE_COLS}
            selection={input.selections.diode}
            onSelect={onSelect('diode')}
            readOnly={readOnly}
            {...compareProps('diode')}
          />
          <Excluded count={match.excluded.diode} one="diode" many="diodes" />
        </div>
      </Step>
    </>
  );
}
