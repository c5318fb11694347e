/**
 * The catalogue and design calls that tests changing parts under designs share: read a part or a design,
 * move a part's lifecycle, edit its parameters, mark a design ready. Librarians change parts; the demo
 * designer owns the designs. Sessions come from helpers/session.ts (one per role per test file).
 */
import request from 'supertest';
import { appUrl } from './stack.ts';
import { sessionCookie } from './session.ts';
import type { Part } from '../../src/lib/domain/parts.ts';

const api = () => request(appUrl());

export const getPart = async (id: number): Promise<Part & { version: number }> =>
  (
    await api()
      .get(`/api/parts/${id}`)
      .set('Cookie', await sessionCookie('librarian'))
  ).body;

export const getDesign = async (id: number) =>
  (
    await api()
      .get(`/api/designs/${id}`)
      .set('Cookie', await sessionCookie('designer'))
  ).body;

export const lifecycle = async (id: number, to: string, version: number, note: string) =>
  api()
    .post(`/api/parts/${id}/lifecycle`)
    .set('Cookie', await sessionCookie('librarian'))
    .send({ lifecycle: to, effectiveDate: '2026-12-01', note, version });

export const markReady = async (id: number, version: number) =>
  api()
    .post(`/api/designs/${id}/status`)
    .set('Cookie', await sessionCookie('designer'))
    .send({ status: 'ready', version });

/** Saves the part with its parameters changed (the rest of the record as it is, at its current version). */
export async function editParams(id: number, change: (params: Record<string, unknown>) => Record<string, unknown>) {
  const part = await getPart(id);
  const { id: _id, ...rest } = part as unknown as Record<string, unknown>;
  return api()
    .put(`/api/parts/${id}`)
    .set('Cookie', await sessionCookie('librarian'))
    .send({ ...rest, params: change(part.params as unknown as Record<string, unknown>), version: part.version });
}
