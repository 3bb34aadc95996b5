import { fileURLToPath } from 'node:url';

// The full Lato 2.0 files committed beside the package, not the web's subset files: a PDF cannot fall
// back to a second font per glyph, so one file must hold both Latin and Latin Extended (ř, Ł, Š, ő).
// The same relative path holds from src/ under vitest and from dist/ when built.
const fontFile = (name: string) => fileURLToPath(new URL(`../../../fonts/${name}`, import.meta.url));

export const LATO_REGULAR = fontFile('Lato-Regular.ttf');
export const LATO_BOLD = fontFile('Lato-Bold.ttf');
