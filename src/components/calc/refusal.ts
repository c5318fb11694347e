/**
 * Turns an API refusal into what a person reads beside a calculator form (pure, browser-safe): each issue
 * whose path maps to a field goes to that field, the summary names the fields by their labels (never by the
 * API's paths), and issues no field can carry are quoted in their own words.
 */
import type { ApiIssue } from '../api-client.ts';

export interface Refusal<F extends string> {
  errors: Partial<Record<F, string>>;
  message: string;
}

export function refusalOf<F extends string>(
  issues: readonly ApiIssue[],
  pathToField: Readonly<Record<string, F>>,
  labels: Readonly<Record<F, string>>,
  fallback = 'The calculator could not use these inputs.',
): Refusal<F> {
  const errors: Partial<Record<F, string>> = {};
  const unplaced: string[] = [];
  for (const issue of issues) {
    const field = pathToField[issue.path];
    if (field === undefined) {
      if (!unplaced.includes(issue.message)) unplaced.push(issue.message);
    } else if (errors[field] === undefined) errors[field] = issue.message;
  }
  const named = (Object.keys(errors) as F[]).map((f) => labels[f]);
  const parts: string[] = [];
  if (named.length) parts.push(`Check the marked ${named.length === 1 ? 'field' : 'fields'}: ${named.join(', ')}.`);
  parts.push(...unplaced.map((m) => (/[.!?]$/.test(m) ? m : `${m}.`)));
  return { errors, message: parts.length ? parts.join(' ') : fallback };
}

/** Field-level errors found before any request (not numbers, out of order), summarised the same way. */
export function localRefusal<F extends string>(errors: Partial<Record<F, string>>, labels: Readonly<Record<F, string>>): Refusal<F> {
  const named = (Object.keys(errors) as F[]).map((f) => labels[f]);
  return {
    errors,
    message: named.length ? `Check the marked ${named.length === 1 ? 'field' : 'fields'}: ${named.join(', ')}.` : '',
  };
}
