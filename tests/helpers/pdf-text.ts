/** Text of every page of a PDF, read with pdfjs-dist (an independent reader, not our writer). */
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

export async function pdfPageTexts(bytes: Uint8Array): Promise<string[]> {
  const doc = await getDocument({ data: bytes.slice(), isEvalSupported: false, verbosity: 0 }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    pages.push(
      content.items
        .map((it) => ('str' in it ? it.str : ''))
        .join(' ')
        .replace(/\s+/g, ' '),
    );
  }
  await doc.destroy();
  return pages;
}
