/**
 * A one-page PDF whose text is set in a hand-made composite font: every character is drawn as a two-byte
 * code (0x0100 upwards, one per distinct character), and only the font's ToUnicode CMap (bfchar lines
 * written here) says which character each code is. A reader that ignores ToUnicode sees glyph numbers.
 * Built from pdf-lib's low-level objects; no glyphs are embedded (nothing is meant to be looked at).
 */
import { PDFDocument, PDFName, PDFString } from 'pdf-lib';

const hex4 = (n: number): string => n.toString(16).toUpperCase().padStart(4, '0');

export async function pdfWithCMapFont(lines: string[]): Promise<Buffer> {
  const chars = [...new Set(lines.join(''))];
  const code = new Map(chars.map((c, i) => [c, 0x0100 + i]));
  const utf16 = (c: string): string => Array.from({ length: c.length }, (_, i) => hex4(c.charCodeAt(i))).join('');
  const cmap = [
    '/CIDInit /ProcSet findresource begin 12 dict begin begincmap',
    '1 begincodespacerange <0000> <FFFF> endcodespacerange',
    `${chars.length} beginbfchar`,
    ...chars.map((c) => `<${hex4(code.get(c)!)}> <${utf16(c)}>`),
    'endbfchar endcmap CMapName currentdict /CMap defineresource pop end end',
  ].join('\n');
  const doc = await PDFDocument.create();
  const page = doc.addPage([595, 842]);
  const ctx = doc.context;
  const font = ctx.register(
    ctx.obj({
      Type: 'Font',
      Subtype: 'Type0',
      BaseFont: 'HandMadeCodes',
      Encoding: 'Identity-H',
      DescendantFonts: [
        ctx.obj({
          Type: 'Font',
          Subtype: 'CIDFontType2',
          BaseFont: 'HandMadeCodes',
          CIDSystemInfo: { Registry: PDFString.of('Adobe'), Ordering: PDFString.of('Identity'), Supplement: 0 },
        }),
      ],
      ToUnicode: ctx.register(ctx.flateStream(cmap)),
    }),
  );
  page.node.set(PDFName.of('Resources'), ctx.obj({ Font: { H1: font } }));
  const content = lines.map((line, i) => `BT /H1 11 Tf 50 ${780 - 16 * i} Td <${[...line].map((c) => hex4(code.get(c)!)).join('')}> Tj ET`);
  page.node.set(PDFName.of('Contents'), ctx.register(ctx.flateStream(content.join('\n'))));
  return Buffer.from(await doc.save());
}
