/**
 * Key parameters of a part for lists, with units and test conditions, per category.
 * Pure: used by the catalogue page and by CSV export.
 */
import { sig } from './units.ts';
import type { Part, PartCategory, PriceSource } from './domain/parts.ts';

export interface SummaryColumn {
  key: string;
  label: string;
  unit: string;
  numeric: boolean;
}

export const CATEGORY_LABELS: Record<PartCategory, { one: string; many: string }> = {
  motor: { one: 'Motor', many: 'Motors' },
  mosfet: { one: 'MOSFET', many: 'MOSFETs' },
  driver: { one: 'Gate driver / level shifter', many: 'Gate drivers and level shifters' },
  diode: { one: 'Diode', many: 'Diodes' },
};

export const SUMMARY_COLUMNS: Record<PartCategory, SummaryColumn[]> = {
  motor: [
    { key: 'ratedV', label: 'Rated', unit: 'V', numeric: true },
    { key: 'range', label: 'Range', unit: 'V', numeric: false },
    { key: 'noLoad', label: 'No-load speed', unit: 'rpm', numeric: true },
    { key: 'noLoadI', label: 'No-load I', unit: 'A', numeric: true },
    { key: 'stallT', label: 'Stall torque', unit: 'mN·m', numeric: true },
    { key: 'stallI', label: 'Stall I', unit: 'A', numeric: true },
  ],
  mosfet: [
    { key: 'channel', label: 'Ch.', unit: '', numeric: false },
    { key: 'vds', label: 'VDS max', unit: 'V', numeric: true },
    { key: 'vgsTh', label: 'VGS(th) max', unit: 'V', numeric: true },
    { key: 'rdsOn', label: 'RDS(on) max @ lowest VGS', unit: '', numeric: false },
    { key: 'id', label: 'ID (25 °C)', unit: 'A', numeric: true },
    { key: 'qg', label: 'Qg', unit: 'nC', numeric: true },
    { key: 'rth', label: 'RθJA', unit: 'K/W', numeric: true },
  ],
  driver: [
    { key: 'kind', label: 'Kind', unit: '', numeric: false },
    { key: 'polarity', label: 'Polarity', unit: '', numeric: false },
    { key: 'supply', label: 'Supply', unit: 'V', numeric: false },
    { key: 'input', label: 'Input VIH', unit: '', numeric: false },
    { key: 'drive', label: 'Source / sink', unit: 'A', numeric: false },
    { key: 'tpd', label: 'Delay', unit: 'ns', numeric: true },
  ],
  diode: [
    { key: 'kind', label: 'Kind', unit: '', numeric: false },
    { key: 'vrrm', label: 'VRRM', unit: 'V', numeric: true },
    { key: 'ifav', label: 'IF(AV)', unit: 'A', numeric: true },
    { key: 'vf', label: 'VF max @ IF', unit: '', numeric: false },
    { key: 'trr', label: 'trr', unit: 'ns', numeric: false },
  ],
};

const n = (v: number, digits = 3): string => sig(v, digits);

export function describeInput(p: Extract<Part, { category: 'driver' }>['params']): string {
  if (p.inputLogic === 'fixed') return `≥ ${n(p.inputHighMin)} V (fixed)`;
  if (p.inputLogic === 'ratio') return `≥ ${Math.round(p.inputHighMin * 100)} % of supply`;
  return `≥ ${Math.round(p.inputHighMin * 100)} % of input rail`;
}

/** Display strings for the summary columns of one part. */
export function summarize(part: Part): Record<string, string> {
  switch (part.category) {
    case 'motor': {
      const p = part.params;
      const range = p.voltageMinV !== null && p.voltageMaxV !== null ? `${n(p.voltageMinV)}–${n(p.voltageMaxV)}` : '—';
      return {
        ratedV: n(p.ratedVoltageV),
        range,
        noLoad: n(p.noLoadSpeedRpm, 5),
        noLoadI: n(p.noLoadCurrentA),
        stallT: n(p.stallTorqueNm * 1000),
        stallI: n(p.stallCurrentA),
      };
    }
    case 'mosfet': {
      const p = part.params;
      const lowest = [...p.rdsOn].sort((a, b) => a.vgsV - b.vgsV)[0];
      const rds = lowest ? `${n(lowest.maxOhm * 1000)} mΩ @ ${n(lowest.vgsV)} V` : '—';
      return {
        channel: p.channel.toUpperCase(),
        vds: n(p.vdsMaxV),
        vgsTh: n(p.vgsThMaxV),
        rdsOn: rds,
        id: n(p.idContinuousA),
        qg: n(p.qgTotalNc),
        rth: n(p.rthJaCPerW),
      };
    }
    case 'driver': {
      const p = part.params;
      return {
        kind: p.kind === 'gate-driver' ? 'Gate driver' : 'Level shifter',
        polarity: p.inverting ? 'Inverting' : 'Non-inverting',
        supply: `${n(p.supplyMinV)}–${n(p.supplyMaxV)}`,
        input: describeInput(p),
        drive: `${n(p.sourceCurrentA)} / ${n(p.sinkCurrentA)}`,
        tpd: n(p.propagationDelayNs),
      };
    }
    case 'diode': {
      const p = part.params;
      const kinds = { schottky: 'Schottky', ultrafast: 'Ultrafast', fast: 'Fast', general: 'General purpose' };
      return {
        kind: kinds[p.kind],
        vrrm: n(p.vrrmV),
        ifav: n(p.ifAvA),
        vf: `${n(p.vfV)} V @ ${n(p.vfAtIfA)} A`,
        trr: p.trrNs === null ? 'none (Schottky)' : n(p.trrNs),
      };
    }
  }
}

/** Units in stock over all of a part's sources. */
export const totalStock = (part: Pick<Part, 'sources'>): number => part.sources.reduce((sum, src) => sum + src.stockQty, 0);

/**
 * Lowest unit price across sources at a quantity, or null: each source's largest break at or below the
 * quantity (or its MOQ, when that is more); of equal breaks, the first listed. No arrays are built: a match
 * prices thousands of tied candidates.
 */
export function bestUnitPrice(part: { sources: readonly PriceSource[] }, qty: number): { price: number; currency: string } | null {
  let best: { price: number; currency: string } | null = null;
  for (const s of part.sources) {
    const limit = Math.max(qty, s.moq);
    let applicable: PriceSource['priceBreaks'][number] | undefined;
    for (const b of s.priceBreaks) if (b.qty <= limit && (applicable === undefined || b.qty > applicable.qty)) applicable = b;
    if (!applicable) continue;
    if (!best || applicable.unitPrice < best.price) best = { price: applicable.unitPrice, currency: s.currency };
  }
  return best;
}
