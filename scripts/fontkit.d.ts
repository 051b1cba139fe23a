/** The few parts of fontkit (a dependency of pdfkit) the font-metrics generator and its drift test use. */
declare module 'fontkit' {
  export interface Glyph { advanceWidth: number }
  export interface Font {
    unitsPerEm: number
    ascent: number
    descent: number
    capHeight: number
    xHeight: number
    characterSet: number[]
    hasGlyphForCodePoint: (codePoint: number) => boolean
    glyphForCodePoint: (codePoint: number) => Glyph
  }
  export function openSync (path: string): Font
}
