/**
 * Text of a datasheet's first pages, read inside the PDF inspection worker (src/server/services/pdf-inspection.ts)
 * after pdf-lib has loaded the file. Plain CommonJS in a string, like the worker itself, so it runs unchanged
 * under tsx / vitest and in the built server bundle; it is tested through inspectPdf (tests/server/pdf-text.test.ts).
 *
 * What it reads, within the budget the worker passes (pages, decoded bytes, characters):
 * - each page's content streams (and form XObjects it paints, two levels deep), decoded through pdf-lib's
 *   decodePDFRawStream, of which only a prefix is taken (getBytes(n) decodes block by block, never the rest);
 * - the string operands of Tj, TJ, ' and " (literal strings with their escapes, and hex strings); a TJ gap
 *   wider than 0.18 em and the line moves (Td, TD, T*, Tm, BT/ET) become spaces and line breaks;
 * - a font's ToUnicode CMap when it has one (codespace ranges, bfchar, bfrange with a start code or an array);
 *   without one, a simple font's bytes are read as PDFDocEncoding (WinAnsi for the 0x80–0x9F codes when the
 *   font says /WinAnsiEncoding) and a composite (Type0) font's codes are skipped: glyph ids name no letters.
 * Scanned pages (images only) give no text, which the caller reports as such.
 */
export const PDF_TEXT_SOURCE = String.raw`
const WIN_ANSI_C1 = {
  0x80: 0x20ac, 0x82: 0x201a, 0x83: 0x0192, 0x84: 0x201e, 0x85: 0x2026, 0x86: 0x2020, 0x87: 0x2021, 0x88: 0x02c6,
  0x89: 0x2030, 0x8a: 0x0160, 0x8b: 0x2039, 0x8c: 0x0152, 0x8e: 0x017d, 0x91: 0x2018, 0x92: 0x2019, 0x93: 0x201c,
  0x94: 0x201d, 0x95: 0x2022, 0x96: 0x2013, 0x97: 0x2014, 0x98: 0x02dc, 0x99: 0x2122, 0x9a: 0x0161, 0x9b: 0x203a,
  0x9c: 0x0153, 0x9e: 0x017e, 0x9f: 0x0178,
};

function hexBytes(s) {
  const hex = s.replace(/[^0-9A-Fa-f]/g, '');
  const even = hex.length % 2 ? hex + '0' : hex;
  const out = new Uint8Array(even.length / 2);
  for (let i = 0; i < out.length; i++) out[i] = parseInt(even.slice(2 * i, 2 * i + 2), 16);
  return out;
}

function bytesToNumber(b) {
  let n = 0;
  for (let i = 0; i < b.length; i++) n = n * 256 + b[i];
  return n;
}

function utf16(b) {
  if (b.length % 2) return String.fromCharCode.apply(null, Array.from(b));
  let s = '';
  for (let i = 0; i < b.length; i += 2) s += String.fromCharCode(b[i] * 256 + b[i + 1]);
  return s;
}

/** A ToUnicode CMap: codespace ranges, single codes and ranges of codes to Unicode text. */
function parseCMap(text) {
  const cmap = { spaces: [], chars: new Map(), ranges: [] };
  const re = /<([0-9A-Fa-f\s]*)>|\[|\]|[A-Za-z]+/g;
  let mode = null;
  let args = [];
  let array = null;
  let m;
  while ((m = re.exec(text))) {
    const tok = m[0];
    if (m[1] !== undefined) (array || args).push(hexBytes(m[1]));
    else if (tok === '[') array = [];
    else if (tok === ']') {
      if (array) args.push(array);
      array = null;
    } else if (tok === 'begincodespacerange' || tok === 'beginbfchar' || tok === 'beginbfrange') {
      mode = tok.slice(5);
      args = [];
    } else if (tok.startsWith('end')) {
      mode = null;
      args = [];
    }
    if (mode === 'codespacerange' && args.length === 2) {
      if (args[0].length === args[1].length && args[0].length >= 1 && args[0].length <= 4)
        cmap.spaces.push({ len: args[0].length, lo: args[0], hi: args[1] });
      args = [];
    } else if (mode === 'bfchar' && args.length === 2) {
      if (args[1] instanceof Uint8Array && args[0].length <= 4) cmap.chars.set(args[0].length + ':' + bytesToNumber(args[0]), utf16(args[1]));
      args = [];
    } else if (mode === 'bfrange' && args.length === 3) {
      const [lo, hi, dst] = args;
      if (lo instanceof Uint8Array && lo.length <= 4)
        cmap.ranges.push({ len: lo.length, lo: bytesToNumber(lo), hi: bytesToNumber(hi), dst });
      args = [];
    }
  }
  cmap.spaces.sort((a, b) => a.len - b.len);
  const first = cmap.spaces[0] || cmap.ranges[0] || null;
  cmap.defaultLen = first ? first.len : cmap.chars.size ? Number(cmap.chars.keys().next().value.split(':')[0]) : 1;
  return cmap;
}

function codeLength(cmap, bytes, at) {
  for (const sp of cmap.spaces) {
    if (at + sp.len > bytes.length) continue;
    let inside = true;
    for (let k = 0; k < sp.len && inside; k++) inside = bytes[at + k] >= sp.lo[k] && bytes[at + k] <= sp.hi[k];
    if (inside) return sp.len;
  }
  return cmap.defaultLen;
}

function cmapLookup(cmap, len, code) {
  const hit = cmap.chars.get(len + ':' + code);
  if (hit !== undefined) return hit;
  for (const r of cmap.ranges) {
    if (r.len !== len || code < r.lo || code > r.hi) continue;
    if (Array.isArray(r.dst)) return r.dst[code - r.lo] ? utf16(r.dst[code - r.lo]) : undefined;
    const dst = Uint8Array.from(r.dst);
    // The start code's last UTF-16 unit counts up through the range.
    if (dst.length >= 2) {
      const last = dst[dst.length - 2] * 256 + dst[dst.length - 1] + (code - r.lo);
      dst[dst.length - 2] = (last >> 8) & 0xff;
      dst[dst.length - 1] = last & 0xff;
    } else if (dst.length === 1) dst[0] = (dst[0] + code - r.lo) & 0xff;
    return utf16(dst);
  }
  return undefined;
}

function latin1(bytes) {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
}

/** Content-stream tokens: numbers, names, strings (bytes), arrays, operators; dictionaries are skipped. */
function* contentTokens(s) {
  const n = s.length;
  let i = 0;
  const isWs = (c) => c === 32 || c === 10 || c === 13 || c === 9 || c === 12 || c === 0;
  const isDelim = (c) => c === 40 || c === 41 || c === 60 || c === 62 || c === 91 || c === 93 || c === 123 || c === 125 || c === 47 || c === 37;
  while (i < n) {
    const c = s.charCodeAt(i);
    if (isWs(c)) { i++; continue; }
    if (c === 37) { while (i < n && s.charCodeAt(i) !== 10 && s.charCodeAt(i) !== 13) i++; continue; }
    if (c === 40) {
      const out = [];
      let depth = 1;
      i++;
      while (i < n && depth > 0) {
        let ch = s.charCodeAt(i++);
        if (ch === 92) {
          const e = s.charCodeAt(i++);
          if (e === 110) out.push(10);
          else if (e === 114) out.push(13);
          else if (e === 116) out.push(9);
          else if (e === 98) out.push(8);
          else if (e === 102) out.push(12);
          else if (e >= 48 && e <= 55) {
            let v = e - 48;
            for (let k = 0; k < 2 && s.charCodeAt(i) >= 48 && s.charCodeAt(i) <= 55; k++) v = v * 8 + (s.charCodeAt(i++) - 48);
            out.push(v & 0xff);
          } else if (e === 13) { if (s.charCodeAt(i) === 10) i++; }
          else if (e === 10) { /* line continuation */ }
          else if (!Number.isNaN(e)) out.push(e);
          continue;
        }
        if (ch === 40) depth++;
        else if (ch === 41 && --depth === 0) break;
        if (ch === 13) { if (s.charCodeAt(i) === 10) i++; ch = 10; }
        out.push(ch);
      }
      yield { t: 'str', v: Uint8Array.from(out) };
      continue;
    }
    if (c === 60) {
      if (s.charCodeAt(i + 1) === 60) { i += 2; continue; }
      const end = s.indexOf('>', i);
      const stop = end < 0 ? n : end;
      yield { t: 'str', v: hexBytes(s.slice(i + 1, stop)) };
      i = stop + 1;
      continue;
    }
    if (c === 62) { i += s.charCodeAt(i + 1) === 62 ? 2 : 1; continue; }
    if (c === 91) { i++; yield { t: '[' }; continue; }
    if (c === 93) { i++; yield { t: ']' }; continue; }
    if (c === 123 || c === 125 || c === 41) { i++; continue; }
    const start = i;
    i++;
    while (i < n && !isWs(s.charCodeAt(i)) && !isDelim(s.charCodeAt(i))) i++;
    const word = s.slice(start, i);
    if (c === 47) yield { t: 'name', v: word.slice(1).replace(/#([0-9A-Fa-f]{2})/g, (_, h) => String.fromCharCode(parseInt(h, 16))) };
    else if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(word)) yield { t: 'num', v: Number(word) };
    else if (word === 'ID') {
      // Inline image data: binary up to the EI that ends it.
      const rest = s.slice(i + 1);
      const m = /[\s\0]EI(?=[\s\0\/\[<(%]|$)/.exec(rest);
      i = m ? i + 1 + m.index + m[0].length : n;
      yield { t: 'op', v: 'EI' };
    } else yield { t: 'op', v: word };
  }
}

/**
 * Text of the first limits.pages pages, at most limits.chars characters, from at most limits.decodedBytes of
 * decoded content and CMap streams; { text, pagesRead, truncated }.
 */
function extractPdfText(doc, lib, limits) {
  const { PDFName, PDFDict, PDFArray, PDFRawStream, PDFStream, pdfDocEncodingDecode, decodePDFRawStream } = lib;
  let bytesLeft = limits.decodedBytes;
  let truncated = false;
  let text = '';
  const fonts = new Map();
  const lookup = (o) => (o === undefined ? undefined : doc.context.lookup(o));
  const dictGet = (dict, key) => (dict instanceof PDFDict ? lookup(dict.get(PDFName.of(key))) : undefined);

  function streamBytes(stream) {
    if (bytesLeft <= 0) { truncated = true; return null; }
    let bytes = null;
    try {
      if (stream instanceof PDFRawStream) bytes = decodePDFRawStream(stream).getBytes(bytesLeft);
      else if (stream instanceof PDFStream) bytes = stream.getUnencodedContents().subarray(0, bytesLeft);
    } catch {
      return null; // a filter pdf-lib does not decode (an image codec) or a damaged stream: no text from it
    }
    if (!bytes) return null;
    bytesLeft -= bytes.length;
    if (bytesLeft <= 0) truncated = true;
    return bytes;
  }

  function fontInfo(resources, name) {
    const dict = dictGet(dictGet(resources, 'Font'), name);
    if (!(dict instanceof PDFDict)) return { cmap: null, composite: false, winAnsi: false };
    if (fonts.has(dict)) return fonts.get(dict);
    const subtype = dictGet(dict, 'Subtype');
    const encoding = dictGet(dict, 'Encoding');
    const baseEncoding = dictGet(encoding, 'BaseEncoding');
    const encName = (encoding instanceof PDFName ? encoding : baseEncoding instanceof PDFName ? baseEncoding : null);
    const toUnicode = dictGet(dict, 'ToUnicode');
    const cmapBytes = toUnicode instanceof PDFStream ? streamBytes(toUnicode) : null;
    const info = {
      cmap: cmapBytes ? parseCMap(latin1(cmapBytes)) : null,
      composite: subtype instanceof PDFName && subtype.asString() === '/Type0',
      winAnsi: encName !== null && encName.asString() === '/WinAnsiEncoding',
    };
    fonts.set(dict, info);
    return info;
  }

  function decodeString(bytes, font) {
    if (font.cmap) {
      let s = '';
      for (let i = 0; i < bytes.length; ) {
        const len = codeLength(font.cmap, bytes, i);
        const code = bytesToNumber(bytes.subarray(i, i + len));
        const u = cmapLookup(font.cmap, len, code);
        if (u !== undefined) s += u;
        else if (len === 1 && !font.composite) s += simpleChars(bytes.subarray(i, i + 1), font);
        i += len;
      }
      return s;
    }
    return font.composite ? '' : simpleChars(bytes, font);
  }

  function simpleChars(bytes, font) {
    if (!font.winAnsi) return pdfDocEncodingDecode(bytes);
    let s = '';
    for (let i = 0; i < bytes.length; i++) s += String.fromCharCode(WIN_ANSI_C1[bytes[i]] || bytes[i]);
    return s;
  }

  const room = () => {
    if (text.length >= limits.chars) { truncated = true; return false; }
    return true;
  };
  const add = (s) => {
    if (!room()) return;
    text += s.replace(/[\0-\x08\x0b\x0e-\x1f]/g, '').slice(0, limits.chars - text.length);
  };
  const sep = (c) => {
    const last = text.charCodeAt(text.length - 1);
    if (text.length > 0 && last !== 32 && last !== 10) add(c);
  };

  function paint(contentBytes, resources, depth) {
    let font = { cmap: null, composite: false, winAnsi: false };
    const stack = [];
    const arrays = [];
    for (const tok of contentTokens(latin1(contentBytes))) {
      if (!room()) return;
      if (tok.t === '[') { arrays.push([]); continue; }
      if (tok.t === ']') { const a = arrays.pop(); (arrays[arrays.length - 1] || stack).push({ t: 'arr', v: a || [] }); continue; }
      if (tok.t !== 'op') { (arrays[arrays.length - 1] || stack).push(tok); continue; }
      const op = tok.v;
      const arg = (k) => stack[k];
      const show = (t) => t && t.t === 'str' && add(decodeString(t.v, font));
      if (op === 'Tf' && arg(0) && arg(0).t === 'name') font = fontInfo(resources, arg(0).v);
      else if (op === 'Tj') show(arg(0));
      else if (op === "'") { sep('\n'); show(arg(0)); }
      else if (op === '"') { sep('\n'); show(arg(2)); }
      else if (op === 'TJ' && arg(0) && arg(0).t === 'arr') {
        for (const el of arg(0).v) {
          if (el.t === 'str') show(el);
          else if (el.t === 'num' && el.v < -180) sep(' ');
        }
      } else if (op === 'Td' || op === 'TD') sep(arg(1) && arg(1).t === 'num' && arg(1).v !== 0 ? '\n' : ' ');
      else if (op === 'T*' || op === 'Tm' || op === 'BT' || op === 'ET') sep('\n');
      else if (op === 'Do' && depth < 2 && arg(0) && arg(0).t === 'name') {
        const xobject = dictGet(dictGet(resources, 'XObject'), arg(0).v);
        const subtype = xobject instanceof PDFStream ? dictGet(xobject.dict, 'Subtype') : undefined;
        if (subtype instanceof PDFName && subtype.asString() === '/Form') {
          const inner = streamBytes(xobject);
          const own = dictGet(xobject.dict, 'Resources');
          if (inner) paint(inner, own instanceof PDFDict ? own : resources, depth + 1);
        }
      }
      stack.length = 0;
    }
  }

  const pages = doc.getPages().slice(0, limits.pages);
  let pagesRead = 0;
  for (const page of pages) {
    if (!room()) break;
    const node = page.node;
    const resources = node.Resources();
    const contents = lookup(node.get(PDFName.of('Contents')));
    const streams = contents instanceof PDFArray ? contents.asArray().map(lookup) : [contents];
    // A page's streams are one content stream cut in pieces: joined before reading.
    const parts = [];
    for (const st of streams) {
      if (!(st instanceof PDFStream)) continue;
      const b = streamBytes(st);
      if (b) parts.push(b, Uint8Array.of(10));
    }
    const joined = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
    let at = 0;
    for (const p of parts) { joined.set(p, at); at += p.length; }
    paint(joined, resources, 0);
    sep('\n');
    pagesRead++;
  }
  if (doc.getPageCount() > pages.length) truncated = true;
  return { text: text.trim(), pagesRead, truncated };
}
`;
