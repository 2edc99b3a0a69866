// PDFs may carry things a viewer runs or opens: JavaScript, launch actions, embedded files, Flash/3D media, XFA forms.
// An uploaded PDF with any of them is refused (ASVS 4.0 12.5.2); whatever is kept is served as a download anyway.
import { PDFArray, PDFDict, PDFDocument, PDFName, PDFStream, type PDFObject } from 'pdf-lib';

const ACTIVE_KEYS = new Set(['JS', 'JavaScript', 'EmbeddedFiles', 'EmbeddedFile', 'RichMedia', 'XFA']);
const ACTIVE_ACTIONS = new Set(['JavaScript', 'Launch', 'RichMediaExecute', 'ImportData']);
// For a file pdf-lib cannot parse: the same names in the raw bytes (names may hide letters as #xx escapes).
const RAW_MARKERS = /\/(JS|JavaScript|Launch|EmbeddedFiles?|RichMedia|XFA)\b/;

function activeIn(obj: PDFObject | undefined, depth: number): string | null {
  if (!obj || depth > 20) return null;
  const dict = obj instanceof PDFStream ? obj.dict : obj instanceof PDFDict ? obj : null;
  if (dict) {
    for (const [key, value] of dict.entries()) {
      const name = key.decodeText();
      if (ACTIVE_KEYS.has(name)) return name;
      if (name === 'S' && value instanceof PDFName && ACTIVE_ACTIONS.has(value.decodeText())) return value.decodeText();
      const inner = activeIn(value, depth + 1);
      if (inner) return inner;
    }
  } else if (obj instanceof PDFArray) {
    for (let i = 0; i < obj.size(); i++) {
      const inner = activeIn(obj.get(i), depth + 1);
      if (inner) return inner;
    }
  }
  return null;
}

/** What active content the PDF carries (a PDF name such as "JavaScript"), or null when it has none. */
export async function activePdfContent(bytes: Uint8Array): Promise<string | null> {
  let doc: PDFDocument;
  try {
    doc = await PDFDocument.load(bytes, { ignoreEncryption: true, updateMetadata: false, throwOnInvalidObject: false });
  } catch {
    const raw = Buffer.from(bytes)
      .toString('latin1')
      .replace(/#([0-9a-fA-F]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16)));
    return RAW_MARKERS.exec(raw)?.[1] ?? null;
  }
  // Encrypted objects (object streams included) cannot be looked into.
  if (doc.isEncrypted) return 'Encrypt';
  for (const [, obj] of doc.context.enumerateIndirectObjects()) {
    const found = activeIn(obj, 0);
    if (found) return found;
  }
  return null;
}
