/**
 * Source Sans 3 for generated PDFs (reports, example datasheets). The .woff files shipped by
 * @fontsource/source-sans-3 are split into subsets, so each face pairs the Latin subset with the Greek one
 * (Ω, θ, μ). Characters neither subset has are spelled out, never thrown on. Without the files the
 * standard Helvetica faces stand in (WinAnsi only).
 */
import fontkit from '@pdf-lib/fontkit';
import { type Color, type PDFDocument, type PDFFont, type PDFPage, StandardFonts } from 'pdf-lib';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';

export interface FontFace {
  /** Primary (Latin) font. */
  main: PDFFont;
  /** Font for characters the primary font lacks (Greek), when available. */
  extra: PDFFont | null;
  mainChars: Set<number>;
  extraChars: Set<number>;
  /** True when only a standard (WinAnsi) font is available. */
  standard: boolean;
}

export interface FontPair {
  regular: FontFace;
  bold: FontFace;
}

export interface LoadFontsOptions {
  /** 600 (semibold) for reports, 700 (bold) for the example datasheets. */
  boldWeight?: 600 | 700;
  /** Use the standard Helvetica faces (as when the font files are missing). */
  standard?: boolean;
}

export interface TextRun {
  text: string;
  font: PDFFont;
}

const fileName = (subset: 'latin' | 'greek', weight: number): string => `source-sans-3-${subset}-${weight}-normal.woff`;

/** Reads one shipped .woff file, or null when the package cannot be found. */
export function readSourceSansFile(name: string): Uint8Array | null {
  const candidates: string[] = [];
  try {
    candidates.push(createRequire(import.meta.url).resolve(`@fontsource/source-sans-3/files/${name}`));
  } catch {
    // bundled builds may not resolve packages: fall back to the working directory
  }
  candidates.push(join(process.cwd(), 'node_modules', '@fontsource', 'source-sans-3', 'files', name));
  for (const path of candidates) {
    try {
      return readFileSync(path);
    } catch {
      // try the next candidate
    }
  }
  return null;
}

async function embedFace(pdf: PDFDocument, weight: number): Promise<FontFace | null> {
  const latin = readSourceSansFile(fileName('latin', weight));
  if (latin == null) return null;
  const main = await pdf.embedFont(latin, { subset: true });
  const greek = readSourceSansFile(fileName('greek', weight));
  const extra = greek ? await pdf.embedFont(greek, { subset: true }) : null;
  return { main, extra, mainChars: new Set(main.getCharacterSet()), extraChars: new Set(extra?.getCharacterSet() ?? []), standard: false };
}

async function standardFace(pdf: PDFDocument, name: StandardFonts): Promise<FontFace> {
  const main = await pdf.embedFont(name);
  return { main, extra: null, mainChars: new Set(main.getCharacterSet()), extraChars: new Set(), standard: true };
}

/** Embeds Source Sans 3 regular plus a bold weight (subsetted), or Helvetica when the files are missing. */
export async function loadSourceSans(pdf: PDFDocument, options: LoadFontsOptions = {}): Promise<FontPair> {
  if (!options.standard) {
    pdf.registerFontkit(fontkit);
    const regular = await embedFace(pdf, 400);
    const bold = regular ? await embedFace(pdf, options.boldWeight ?? 600) : null;
    if (regular && bold) return { regular, bold };
  }
  return { regular: await standardFace(pdf, StandardFonts.Helvetica), bold: await standardFace(pdf, StandardFonts.HelveticaBold) };
}

/** Stand-ins for characters a face lacks (the shipped subsets have no ≤, ≥, arrows or check marks). */
const SPELLED: Readonly<Record<string, string>> = {
  Ω: 'Ohm',
  θ: 'th',
  µ: 'u',
  μ: 'u',
  τ: 'tau',
  η: 'eta',
  Δ: 'delta',
  α: 'alpha',
  '−': '-',
  '–': '-',
  '—': '-',
  '≤': '<=',
  '≥': '>=',
  '≈': '~',
  '·': '*',
  '×': 'x',
  '±': '+/-',
  '°': ' deg',
  '→': '->',
  '√': 'sqrt',
  '✓': 'v',
  '✕': 'x',
  '½': '1/2',
  '²': '^2',
  '…': '...',
  '•': '-',
  '⚠': 'Caution:',
  '⇄': '<->',
  '✗': 'x',
  '‘': "'",
  '’': "'",
  '“': '"',
  '”': '"',
};

/** True when the face draws every character of `chars` without a stand-in. */
export function faceHasChars(face: FontFace, chars: string): boolean {
  return [...chars].every((ch) => {
    const cp = ch.codePointAt(0) ?? 0;
    return face.mainChars.has(cp) || face.extraChars.has(cp);
  });
}

/** Splits text into runs that each font can draw; characters neither font has are spelled out. */
export function textRuns(face: FontFace, text: string): TextRun[] {
  const runs: TextRun[] = [];
  const push = (ch: string, font: PDFFont): void => {
    const last = runs[runs.length - 1];
    if (last && last.font === font) last.text += ch;
    else runs.push({ text: ch, font });
  };
  for (const ch of text) {
    const cp = ch.codePointAt(0) ?? 0x3f;
    if (face.mainChars.has(cp)) push(ch, face.main);
    else if (face.extra && face.extraChars.has(cp)) push(ch, face.extra);
    else for (const alt of SPELLED[ch] ?? '?') push(face.mainChars.has(alt.codePointAt(0) ?? 0) ? alt : '?', face.main);
  }
  return runs;
}

export function measureText(face: FontFace, text: string, sizePt: number): number {
  return textRuns(face, text).reduce((w, r) => w + r.font.widthOfTextAtSize(r.text, sizePt), 0);
}

/** Draws one line of text starting at (x, y), switching fonts between runs. */
export function drawTextRuns(
  page: PDFPage,
  face: FontFace,
  text: string,
  at: { x: number; y: number; sizePt: number; color: Color },
): void {
  let x = at.x;
  for (const run of textRuns(face, text)) {
    page.drawText(run.text, { x, y: at.y, size: at.sizePt, font: run.font, color: at.color });
    x += run.font.widthOfTextAtSize(run.text, at.sizePt);
  }
}
