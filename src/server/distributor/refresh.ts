/**
 * One refresh of the distributor offers cache: under the lock in MariaDB (only one server at a time),
 * ask the distributor for every approved part in batches, write the offers that came back valid, and on a
 * failed batch or a broken offer keep the cached figures and record the error on them. Never throws for
 * a distributor failure: the outcome says what happened.
 */
import os from 'node:os';
import { randomUUID } from 'node:crypto';
import type { Db } from '../db.ts';
import { DistributorError, fetchOffers, type ClientOptions } from './client.ts';
import { markOffersFailed, partsToRefresh, tryLockRefresh, unlockRefresh, upsertOffer } from '../repos/distributor-offers.ts';

export interface RefreshOutcome {
  /** False when another server held the lock: this one did nothing. */
  ran: boolean;
  parts: number;
  batches: number;
  failedBatches: number;
  offersWritten: number;
  offersRejected: number;
  errors: string[];
}

export interface RefreshDeps {
  db: Db;
  client: ClientOptions;
  /** Part numbers per request. */
  batchSize?: number;
  /** The lock frees itself after this long even if this server dies holding it, s. */
  lockTtlS?: number;
  /** Skip (ran: false) when any server started a refresh less than this long ago, s (the schedule's rounds). */
  minGapS?: number;
  log?: (line: string) => void;
}

export const DEFAULT_BATCH_SIZE = 50;

function summary(o: RefreshOutcome): string {
  const head = `${o.parts} parts in ${o.batches} requests: ${o.offersWritten} offers written, ${o.offersRejected} rejected, ${o.failedBatches} requests failed`;
  return o.errors.length ? `${head}; ${o.errors.slice(0, 3).join('; ')}` : head;
}

export async function refreshOffers(deps: RefreshDeps): Promise<RefreshOutcome> {
  const log = deps.log ?? ((line: string) => console.warn(`[distributor] ${line}`));
  const holder = `${os.hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`.slice(0, 120);
  const outcome: RefreshOutcome = { ran: false, parts: 0, batches: 0, failedBatches: 0, offersWritten: 0, offersRejected: 0, errors: [] };
  if (!(await tryLockRefresh(deps.db, holder, deps.lockTtlS ?? 600, deps.minGapS ?? 0))) return outcome;
  outcome.ran = true;
  try {
    const parts = await partsToRefresh(deps.db);
    outcome.parts = parts.length;
    const idsByMpn = new Map<string, number[]>();
    for (const p of parts) idsByMpn.set(p.mpn, [...(idsByMpn.get(p.mpn) ?? []), p.id]);
    const mpns = [...idsByMpn.keys()];
    const size = deps.batchSize ?? DEFAULT_BATCH_SIZE;
    for (let i = 0; i < mpns.length; i += size) {
      const batch = mpns.slice(i, i + size);
      outcome.batches++;
      const at = new Date();
      try {
        const result = await fetchOffers(batch, deps.client);
        for (const offer of result.offers) {
          for (const partId of idsByMpn.get(offer.mpn) ?? []) {
            await upsertOffer(
              deps.db,
              {
                partId,
                mpn: offer.mpn,
                distributor: result.distributor,
                sku: offer.sku,
                stockQty: offer.stock,
                moq: offer.moq,
                currency: offer.currency,
                priceBreaks: offer.priceBreaks,
                leadTimeDays: offer.leadTimeDays,
              },
              at,
            );
            outcome.offersWritten++;
          }
        }
        for (const r of result.rejected) {
          outcome.offersRejected++;
          const why = `offer failed validation: ${r.problems.join('; ')}`;
          log(`${result.distributor} offer #${r.index} (${r.mpn ?? 'no part number'}): ${why}`);
          if (r.mpn) await markOffersFailed(deps.db, idsByMpn.get(r.mpn) ?? [], why, at, result.distributor);
        }
      } catch (err) {
        if (!(err instanceof DistributorError)) throw err;
        outcome.failedBatches++;
        outcome.errors.push(err.message);
        log(`request for ${batch.length} part numbers failed: ${err.message}`);
        await markOffersFailed(
          deps.db,
          batch.flatMap((m) => idsByMpn.get(m) ?? []),
          err.message,
          at,
        );
      }
    }
    return outcome;
  } catch (err) {
    outcome.errors.push((err as Error).message);
    throw err;
  } finally {
    await unlockRefresh(deps.db, holder, { ok: outcome.failedBatches === 0 && outcome.errors.length === 0, text: summary(outcome) });
  }
}
