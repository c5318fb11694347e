/**
 * The parts CSV that npm run bench imports (POST /api/imports?mode=commit): `rows` new invented parts in the
 * catalogue's mix (50,000 : 10,000 : 5,000 : 2,000 MOSFETs, diodes, drivers, motors) from the same
 * generator (catalogue.ts), written with the export's own row mapping (services/parts-csv.ts) so the file
 * has exactly the import format. Serials start far above the catalogue's, so the part numbers and SKUs are
 * new; each run passes its own `firstSerial`. Review status pending, as a librarian's import arrives.
 */
import { toCsv } from '../../src/lib/csv.ts';
import type { Part } from '../../src/lib/domain/parts.ts';
import type { NewPart } from '../../src/server/repos/parts.ts';
import { CSV_COLUMNS, partToCsvRow } from '../../src/server/services/parts-csv.ts';
import { FULL_SIZE, makeDiode, makeDriver, makeMosfet, makeMotor, rng } from './catalogue.ts';

/** Serials of imported parts start here (the catalogue's run from 1 to its size). */
export const IMPORT_SERIAL_BASE = 10_000_000;

export function importFile(rows: number, firstSerial: number): { csv: string; mpns: string[]; bytes: number } {
  const r = rng(firstSerial);
  const total = FULL_SIZE.mosfets + FULL_SIZE.diodes + FULL_SIZE.drivers + FULL_SIZE.motors;
  const share = (n: number) => Math.round((rows * n) / total);
  const counts = { mosfet: share(FULL_SIZE.mosfets), diode: share(FULL_SIZE.diodes), driver: share(FULL_SIZE.drivers) };
  const parts: NewPart[] = [];
  let serial = firstSerial;
  for (let i = 0; i < rows; i++) {
    const make =
      i < counts.mosfet
        ? makeMosfet
        : i < counts.mosfet + counts.diode
          ? makeDiode
          : i < counts.mosfet + counts.diode + counts.driver
            ? makeDriver
            : makeMotor;
    parts.push({ ...make(r, serial++), reviewStatus: 'pending' } as NewPart);
  }
  const records = parts.map((p) => partToCsvRow({ ...p, id: 0, version: 1 } as Part));
  const csv = toCsv(
    CSV_COLUMNS,
    records.map((rec) => CSV_COLUMNS.map((c) => rec[c])),
  );
  return { csv, mpns: parts.map((p) => p.mpn), bytes: Buffer.byteLength(csv, 'utf8') };
}
