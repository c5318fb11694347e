import { useState } from 'react';
import { postJson } from '../api-client.ts';
import { motorHandoffHref, type MotorHandoff } from '../../lib/motor-handoff.ts';
import { refusalOf } from './refusal.ts';

export interface CalculatorViewer {
  /** May start a design (designers). */
  canDesign: boolean;
  /** May enter a part (designers propose it for review; librarians add it, here also for review). */
  canPropose: boolean;
}

type ProposeField = 'manufacturer' | 'mpn' | 'description';
const PROPOSE_LABELS: Record<ProposeField, string> = { manufacturer: 'Maker', mpn: 'Part number', description: 'Description' };
const PROPOSE_PATHS: Record<string, ProposeField> = { manufacturer: 'manufacturer', mpn: 'mpn', description: 'description' };

/**
 * What a person can do with the motor the calculator accepted: start a design from it, or propose it to the
 * catalogue, where it waits for a librarian's review like every other proposal.
 */
export default function MotorActions({ motor, viewer }: { motor: MotorHandoff | null; viewer: CalculatorViewer | null }) {
  const [open, setOpen] = useState(false);
  const [form, setForm] = useState<Record<ProposeField, string>>({ manufacturer: '', mpn: '', description: '' });
  const [errors, setErrors] = useState<Partial<Record<ProposeField, string>>>({});
  const [message, setMessage] = useState('');
  const [proposed, setProposed] = useState<{ id: number; mpn: string } | null>(null);
  const [sending, setSending] = useState(false);

  if (!viewer)
    return (
      <p className="text-sm text-ink-soft mt-3" data-testid="motor-actions">
        <a href="/signin?next=%2Fcalculators">Sign in</a> to start a design from this motor or to propose it to the catalogue.
      </p>
    );
  if (!viewer.canDesign && !viewer.canPropose) return null;

  async function propose(e: React.FormEvent) {
    e.preventDefault();
    if (!motor) return;
    setSending(true);
    setMessage('');
    const res = await postJson<{ id: number; mpn: string }>('/api/parts', {
      category: 'motor',
      manufacturer: form.manufacturer,
      mpn: form.mpn,
      description: form.description,
      reviewStatus: 'pending',
      params: {
        ratedVoltageV: motor.ratedVoltageV,
        noLoadSpeedRpm: motor.noLoadSpeedRpm,
        noLoadCurrentA: motor.noLoadCurrentA,
        stallTorqueNm: motor.stallTorqueNm,
        stallCurrentA: motor.stallCurrentA,
      },
    });
    setSending(false);
    if (res.ok) {
      setProposed({ id: res.data.id, mpn: res.data.mpn });
      setErrors({});
      setOpen(false);
      return;
    }
    const refusal = refusalOf(res.issues, PROPOSE_PATHS, PROPOSE_LABELS, res.error);
    setErrors(refusal.errors);
    setMessage(res.issues.length ? refusal.message : res.error);
  }

  const field = (key: ProposeField, required: boolean) => (
    <div className="field">
      <label htmlFor={`propose-${key}`}>
        {PROPOSE_LABELS[key]}
        {required ? '' : ' (optional)'}
      </label>
      <input
        id={`propose-${key}`}
        value={form[key]}
        required={required}
        onChange={(e) => setForm((f) => ({ ...f, [key]: e.target.value }))}
        aria-invalid={errors[key] ? true : undefined}
        aria-describedby={errors[key] ? `propose-${key}-err` : undefined}
      />
      {errors[key] ? (
        <span id={`propose-${key}-err`} className="field-error" role="alert">
          ⚠ {errors[key]}
        </span>
      ) : null}
    </div>
  );

  return (
    <div className="mt-3 text-sm" data-testid="motor-actions">
      <div className="flex flex-wrap gap-2 items-center">
        {viewer.canDesign ? (
          motor ? (
            <a className="btn btn-quiet" href={motorHandoffHref(motor)} data-testid="start-design">
              Start a design from this motor
            </a>
          ) : (
            <span className="text-ink-faint">Start a design: correct the marked fields first.</span>
          )
        ) : null}
        {viewer.canPropose && !proposed ? (
          <button type="button" className="btn btn-quiet" aria-expanded={open} onClick={() => setOpen((o) => !o)} disabled={!motor}>
            Propose this motor to the catalogue
          </button>
        ) : null}
      </div>
      {proposed ? (
        <p role="status" className="mt-2" data-testid="proposed">
          ✓ Proposed <a href={`/parts/${proposed.id}`}>{proposed.mpn}</a>: it waits for a librarian&rsquo;s review before designs can use
          it.
        </p>
      ) : null}
      {open && motor ? (
        <form className="card p-3 mt-2 grid gap-3 md:grid-cols-4 items-end" onSubmit={propose} noValidate data-testid="propose-form">
          {field('manufacturer', true)}
          {field('mpn', true)}
          {field('description', false)}
          <div>
            <button type="submit" className="btn" disabled={sending}>
              {sending ? 'Sending…' : 'Send for review'}
            </button>
          </div>
          <p className="md:col-span-4 text-xs text-ink-faint">
            The record carries the datasheet points above (rated voltage, no-load speed and current, stall current and torque); a librarian
            checks them against the datasheet before the motor is approved.
          </p>
          {message ? (
            <p role="alert" className="md:col-span-4 text-bad">
              ⚠ {message}
            </p>
          ) : null}
        </form>
      ) : null}
    </div>
  );
}
