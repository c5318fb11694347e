/**
 * PDF inspection (validation and page count) in a worker thread with a budget, so a crafted file (an
 * object stream that unpacks to hundreds of MB, millions of tiny objects) costs at most one bounded
 * worker, never the server's heap or its event loop:
 * - memory: the worker's V8 heap is capped (resourceLimits); running out ends the worker, not the app;
 * - time: a deadline terminates it;
 * - unpacking: before pdf-lib parses, the streams it would unpack on load (object and cross-reference
 *   streams) are inflated with zlib's maxOutputLength against a total budget.
 * - text: the first `textPages` pages' text is read (src/server/services/pdf-text-source.ts) from at most
 *   `textDecodedBytes` of decoded content, up to `textChars` characters, for the datasheet check on attach.
 * The worker is plain CommonJS evaluated from a string (eval: true), so it runs unchanged under tsx /
 * vitest and in the built server bundle; pdf-lib is resolved here and required by absolute path.
 */
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';
import { PDF_TEXT_SOURCE } from './pdf-text-source.ts';

export const PDF_INSPECTION_BUDGET = {
  heapMb: 256,
  deadlineMs: 10_000,
  /** Total bytes the object and cross-reference streams may unpack to. */
  unpackedBytes: 32 * 1024 * 1024,
  /** Inspections at once (each may use up to heapMb); later uploads wait their turn. */
  concurrent: 2,
  /** Pages whose text is read, decoded content bytes read for it (all pages together), characters kept. */
  textPages: 3,
  textDecodedBytes: 4 * 1024 * 1024,
  textChars: 100_000,
} as const;

/** The text read from the first pages; `truncated` when a limit (pages, bytes, characters) cut it short. */
export interface PdfText {
  text: string;
  pagesRead: number;
  truncated: boolean;
  /** Set when reading the text failed (the file itself loaded): the text is then empty. */
  error?: string;
}

export type PdfInspection =
  | { ok: true; pages: number; text: PdfText }
  | { ok: false; reason: 'unreadable' | 'no-pages' | 'unpacked-too-large' | 'out-of-memory' | 'too-slow'; detail?: string };

const WORKER_SOURCE = String.raw`
const { parentPort, workerData } = require('node:worker_threads');
const zlib = require('node:zlib');
const { bytes, pdfLibPath, unpackedBytes, textLimits } = workerData;
${PDF_TEXT_SOURCE}

/** Inflates every Flate object/xref stream against one budget; false when the budget is exceeded. */
function unpackedWithinBudget(buf) {
  const text = buf.toString('latin1');
  const re = /stream(\r\n|\n|\r)/g;
  let left = unpackedBytes;
  let m;
  while ((m = re.exec(text))) {
    const head = text.slice(Math.max(0, m.index - 4096), m.index);
    const objAt = head.lastIndexOf(' obj');
    const dict = objAt >= 0 ? head.slice(objAt) : head;
    if (!/\/Type\s*\/(ObjStm|XRef)\b/.test(dict) || !/\/FlateDecode\b/.test(dict)) continue;
    const start = m.index + m[0].length;
    const end = text.indexOf('endstream', start);
    if (end < 0) continue;
    try {
      const out = zlib.inflateSync(buf.subarray(start, end), { maxOutputLength: left + 1, finishFlush: zlib.constants.Z_SYNC_FLUSH });
      left -= out.length;
      if (left < 0) return false;
    } catch (err) {
      if (err && err.code === 'ERR_BUFFER_TOO_LARGE') return false;
    }
    re.lastIndex = end;
  }
  return true;
}

(async () => {
  const buf = Buffer.from(bytes);
  if (!unpackedWithinBudget(buf)) return parentPort.postMessage({ ok: false, reason: 'unpacked-too-large' });
  const lib = require(pdfLibPath);
  try {
    const doc = await lib.PDFDocument.load(buf, { ignoreEncryption: true, updateMetadata: false });
    const pages = doc.getPageCount();
    if (pages < 1) return parentPort.postMessage({ ok: false, reason: 'no-pages' });
    let text;
    try {
      text = extractPdfText(doc, lib, textLimits);
    } catch (err) {
      text = { text: '', pagesRead: 0, truncated: false, error: String(err && err.message).slice(0, 200) };
    }
    parentPort.postMessage({ ok: true, pages, text });
  } catch (err) {
    parentPort.postMessage({ ok: false, reason: 'unreadable', detail: String(err && err.message).slice(0, 200) });
  }
})();
`;

let pdfLibPath: string | null = null;
let running = 0;
const waiting: (() => void)[] = [];

async function slot(): Promise<() => void> {
  if (running >= PDF_INSPECTION_BUDGET.concurrent) await new Promise<void>((resolve) => waiting.push(resolve));
  running++;
  return () => {
    running--;
    waiting.shift()?.();
  };
}

function runWorker(bytes: Uint8Array, budget: typeof PDF_INSPECTION_BUDGET): Promise<PdfInspection> {
  pdfLibPath ??= createRequire(import.meta.url).resolve('pdf-lib');
  const copy = new Uint8Array(bytes); // its own buffer, handed over to the worker without another copy
  return new Promise((resolve) => {
    let settled = false;
    const worker = new Worker(WORKER_SOURCE, {
      eval: true,
      workerData: {
        bytes: copy,
        pdfLibPath,
        unpackedBytes: budget.unpackedBytes,
        textLimits: { pages: budget.textPages, decodedBytes: budget.textDecodedBytes, chars: budget.textChars },
      },
      transferList: [copy.buffer],
      resourceLimits: { maxOldGenerationSizeMb: budget.heapMb, maxYoungGenerationSizeMb: 32 },
    });
    // The answer waits until the worker has ended and given its heap back: otherwise the next inspection
    // (the slot is freed when this resolves) could start while this one still holds up to heapMb.
    const done = (result: PdfInspection): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate().then(
        () => resolve(result),
        () => resolve(result),
      );
    };
    const timer = setTimeout(() => done({ ok: false, reason: 'too-slow' }), budget.deadlineMs);
    worker.on('message', (m: PdfInspection) => done(m));
    worker.on('error', (err: NodeJS.ErrnoException) =>
      done(
        err.code === 'ERR_WORKER_OUT_OF_MEMORY'
          ? { ok: false, reason: 'out-of-memory' }
          : { ok: false, reason: 'unreadable', detail: err.message },
      ),
    );
    worker.on('exit', () => done({ ok: false, reason: 'out-of-memory', detail: 'the inspection ended without an answer' }));
  });
}

/** Inspects a PDF within the budget; never throws for anything the file contains. */
export async function inspectPdf(bytes: Uint8Array, budget: typeof PDF_INSPECTION_BUDGET = PDF_INSPECTION_BUDGET): Promise<PdfInspection> {
  const release = await slot();
  try {
    return await runWorker(bytes, budget);
  } finally {
    release();
  }
}
