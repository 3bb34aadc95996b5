import { fileURLToPath } from 'node:url';
import { openSync, type Font } from 'fontkit';

// The full Lato 2.0 files committed beside the package, not the web's subset files: a PDF cannot fall
// back to a second font per glyph, so one file must hold both Latin and Latin Extended (ř, Ł, Š, ő).
// The same relative path holds from src/ under vitest and from dist/ when built.
const fontFile = (name: string) => fileURLToPath(new URL(`../../../fonts/${name}`, import.meta.url));

export const LATO_REGULAR = fontFile('Lato-Regular.ttf');
export const LATO_BOLD = fontFile('Lato-Bold.ttf');

let regular: Font | null = null;

/**
 * The text with every character Lato cannot draw replaced by "?". pdfkit would measure such characters
 * as nothing and print empty boxes, so a long name in another script ran off the page; the mark keeps
 * the wrapping right and shows that something was there.
 */
export function drawableInLato(text: string): string {
  regular ??= openSync(LATO_REGULAR);
  let out = '';
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    out += cp < 0x20 || regular.hasGlyphForCodePoint(cp) ? ch : '?';
  }
  return out;
}

/** Passes everything the document prints or measures through drawableInLato. */
export function printOnlyDrawable<D extends object>(doc: D): D {
  const methods = doc as unknown as Record<string, (...args: unknown[]) => unknown>;
  for (const name of ['text', 'widthOfString', 'heightOfString']) {
    const original = methods[name]!.bind(doc);
    methods[name] = (value: unknown, ...rest: unknown[]) => original(typeof value === 'string' ? drawableInLato(value) : value, ...rest);
  }
  return doc;
}
