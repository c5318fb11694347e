import type { DesignInput, PartRole } from '../../lib/domain/design.ts';
import { effectiveSwitchList, type DesignMatch, type MatchEntry } from '../../lib/design-match.ts';
import { judgedAtShort, pairedWithShort } from '../../lib/design-words.ts';
import { FootprintChange } from './CandidateTable.tsx';
import Verdict from './Verdict.tsx';

const LINES: { role: PartRole; label: string; refdes: string }[] = [
  { role: 'switch', label: 'Low-side switch', refdes: 'Q1' },
  { role: 'driver', label: 'Gate driver', refdes: 'U1' },
  { role: 'diode', label: 'Freewheel diode', refdes: 'D1' },
];

function listFor(match: DesignMatch, role: PartRole): MatchEntry[] {
  return role === 'switch' ? effectiveSwitchList(match) : role === 'driver' ? match.driver : match.diode;
}

/** The pairing under the chosen switch and driver: what drive the switch is judged at, which switch the driver drives. */
function pairingNote(match: DesignMatch, role: PartRole, chosen: MatchEntry | undefined): string | null {
  if (!chosen) return null;
  if (role === 'switch') return judgedAtShort(match.switchDrive);
  if (role === 'driver' && 'pairing' in chosen) {
    return pairedWithShort((chosen as DesignMatch['driver'][number]).pairing);
  }
  return null;
}

function PartRef({ entry, id }: { entry: MatchEntry | undefined; id: number }) {
  if (!entry) return <span className="text-ink-soft">part {id} (not among current candidates)</span>;
  return (
    <span className="inline-flex items-center gap-1.5">
      <span className="font-semibold">{entry.mpn}</span>
      <span className="text-ink-soft">{entry.manufacturer}</span>
      <Verdict verdict={entry.verdict} />
      {entry.footprintChange ? <FootprintChange /> : null}
    </span>
  );
}

/** The chosen part per line and up to three alternates, as the bill of materials will list them. */
export default function SelectionPanel({ input, match }: { input: DesignInput; match: DesignMatch }) {
  return (
    <div className="table-scroll">
      <table className="data-table w-full text-sm" data-testid="selection">
        <thead>
          <tr>
            <th>Ref.</th>
            <th>Line</th>
            <th>Chosen</th>
            <th>Alternates</th>
          </tr>
        </thead>
        <tbody>
          {LINES.filter((l) => l.role !== 'driver' || match.driverNeeded || input.selections.driver.chosenPartId != null).map((l) => {
            const list = listFor(match, l.role);
            const find = (id: number) => list.find((e) => e.partId === id);
            const sel = input.selections[l.role];
            const chosen = sel.chosenPartId == null ? undefined : find(sel.chosenPartId);
            return (
              <tr key={l.role} data-role={l.role}>
                <td>{l.refdes}</td>
                <td>{l.label}</td>
                <td>
                  {sel.chosenPartId == null ? (
                    <span className="text-warn">! nothing chosen yet</span>
                  ) : (
                    <PartRef entry={chosen} id={sel.chosenPartId} />
                  )}
                  {pairingNote(match, l.role, chosen) ? (
                    <div className="text-xs text-ink-soft" data-testid={`pairing-${l.role}`}>
                      {pairingNote(match, l.role, chosen)}
                    </div>
                  ) : null}
                  {chosen && chosen.verdict === 'fail' ? (
                    <div className="text-bad text-xs">✕ fails with the current inputs: pick another part</div>
                  ) : null}
                </td>
                <td>
                  {sel.alternatePartIds.length === 0 ? (
                    <span className="text-ink-soft">none</span>
                  ) : (
                    <ul className="grid gap-0.5">
                      {sel.alternatePartIds.map((id) => (
                        <li key={id}>
                          <PartRef entry={find(id)} id={id} />
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
