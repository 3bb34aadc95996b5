// fontkit ships no types; the PDF code needs only to ask a font whether it holds a glyph.
declare module 'fontkit' {
  export interface Font {
    hasGlyphForCodePoint(codePoint: number): boolean;
  }
  export function openSync(path: string): Font;
}
