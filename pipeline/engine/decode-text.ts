import type { Diagnostic } from '../core/diagnostics/diagnostic.js';
import { utf16Encoding } from '../core/formats/lab-file-quirks.js';

const utf8 = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false });
const latin1 = new TextDecoder('latin1');

/**
 * Text of a metadata file. UTF-8 (with or without BOM) is expected; older lab PCs write
 * Windows-1252 (a `µ` or `°` in a note), and spreadsheet "Unicode text" exports write UTF-16
 * with a byte-order mark; both are read as such with an info diagnostic.
 */
export function decodeText(bytes: Uint8Array, file: string): { text: string; diagnostics: Diagnostic[] } {
  const utf16 = utf16Encoding(bytes);
  if (utf16 !== null) {
    return {
      text: new TextDecoder(utf16).decode(bytes),
      diagnostics: [{ severity: 'info', rule: 'text-utf16', stage: 'ingest', file, message: `${file} is UTF-16 (${utf16 === 'utf-16le' ? 'little' : 'big'}-endian, as spreadsheet "Unicode text" exports write it); read as such`, hint: 'save the file as UTF-8 CSV' }],
    };
  }
  try {
    return { text: utf8.decode(bytes), diagnostics: [] };
  } catch {
    return {
      text: latin1.decode(bytes),
      diagnostics: [{ severity: 'info', rule: 'text-not-utf8', stage: 'ingest', file, message: `${file} is not valid UTF-8; read as Windows-1252`, hint: 'save the file as UTF-8' }],
    };
  }
}
