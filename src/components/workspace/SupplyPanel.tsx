import type { SupplyReport } from '../../lib/supply.ts';
import { bulkCapacitanceView, checkVerdict, limitRelation, quantityText, torqueText } from '../../lib/supply-view.ts';
import CheckName from './CheckName.tsx';
import Verdict from './Verdict.tsx';

/** The checks of a supply report: verdict in words and icon, value against its limit, the note. Shared with the calculators page. */
export function SupplyChecks({ report, testId }: { report: SupplyReport; testId?: string }) {
  if (report.checks.length === 0) {
    return (
      <p className="text-sm text-ink-soft">
        No supply check applies: give the source’s continuous rating, its current limit or a shared controller to check them.
      </p>
    );
  }
  return (
    <ul className="grid gap-2" data-testid={testId}>
      {report.checks.map((c) => (
        <li key={c.id} className="card p-2 text-sm" data-testid={`supply-check-${c.id}`} data-verdict={checkVerdict(c)}>
          <div className="flex flex-wrap items-baseline gap-2">
            <Verdict verdict={checkVerdict(c)} />
            <strong>
              <CheckName id={c.id} />
            </strong>
            <span className="num text-ink-soft" data-testid="supply-check-values">
              {quantityText(c.value, c.unit)} (limit {limitRelation(c.id)} {quantityText(c.limit, c.unit)})
            </span>
          </div>
          <p className="mt-1">{c.note}</p>
        </li>
      ))}
    </ul>
  );
}

/** Start figures and the ride-through capacitor. */
export function SupplyFigures({ report, worstCases }: { report: SupplyReport; worstCases: boolean }) {
  const bulk = bulkCapacitanceView(report.bulkCapacitanceF);
  const limited = report.startActualCurrentA < report.startCurrentA;
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-0.5 num text-sm" data-testid="supply-figures">
      <dt className="text-ink-soft">Start current the motor asks for{worstCases ? ' (highest supply, coldest winding)' : ''}</dt>
      <dd className="font-semibold">{quantityText(report.startCurrentA, 'A')}</dd>
      <dt className="text-ink-soft">Start current the source delivers</dt>
      <dd>
        {quantityText(report.startActualCurrentA, 'A')}
        {limited ? ' (held at the limit)' : ''}
      </dd>
      <dt className="text-ink-soft">Source terminals at start{worstCases ? ' (lowest supply)' : ''}</dt>
      <dd>{quantityText(report.sourceVoltageAtStartV, 'V')}</dd>
      <dt className="text-ink-soft">Start torque{worstCases ? ' (lowest supply, warmest winding)' : ''}</dt>
      <dd>{torqueText(report.startTorqueNm)}</dd>
      <dt className="text-ink-soft">Running current</dt>
      <dd>{quantityText(report.runningCurrentA, 'A')}</dd>
      {bulk ? (
        <>
          <dt className="text-ink-soft">Bulk capacitance to ride through the start</dt>
          <dd data-testid="supply-bulk" className={bulk.practical ? '' : 'text-bad font-semibold'}>
            {bulk.practical ? (
              bulk.text
            ) : (
              <>
                <span aria-hidden="true">✕ </span>
                {bulk.text}: impractical
              </>
            )}
          </dd>
        </>
      ) : null}
    </dl>
  );
}

export function SupplyNotes({ notes }: { notes: string[] }) {
  if (notes.length === 0) return null;
  return (
    <ul className="list-disc pl-5 grid gap-0.5 text-sm" data-testid="supply-notes">
      {notes.map((n) => (
        <li key={n}>{n}</li>
      ))}
    </ul>
  );
}

/** Workspace step: can the source start the motor, and does a controller on the same source survive the start? */
export default function SupplyPanel({ supply }: { supply: SupplyReport | null }) {
  if (!supply) {
    return (
      <p className="card p-3 text-sm text-ink-soft" data-testid="supply-empty">
        No supply figures yet: the motor and supply inputs are needed to judge the start.
      </p>
    );
  }
  return (
    <div className="grid gap-3 lg:grid-cols-[1.4fr_1fr]" data-testid="supply-panel">
      <div>
        <p className="mb-2 text-sm flex items-center gap-2" data-testid="supply-verdict">
          <Verdict verdict={supply.verdict} /> <span>Supply and logic at the design’s worst cases</span>
        </p>
        <SupplyChecks report={supply} testId="supply-checks" />
      </div>
      <div className="card p-3">
        <h3 className="font-semibold mb-1 text-sm">Start figures</h3>
        <SupplyFigures report={supply} worstCases />
        <h3 className="font-semibold mt-3 mb-1 text-sm">What to change, and cautions</h3>
        <SupplyNotes notes={supply.notes} />
      </div>
    </div>
  );
}
