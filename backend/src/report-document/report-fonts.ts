import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { errorMessage } from '../common/errors/error-message';

/** The repository's `fonts/` folder, the same one the client is served from. */
export const DEFAULT_FONTS_DIR = resolve(__dirname, '..', '..', '..', 'fonts');

export type FontRole = 'regular' | 'medium' | 'bold' | 'mono';

/**
 * The shipped fonts are @fontsource subsets (one file per script), so one PDF font cannot
 * draw "Δf" or "Łódź": each run of text is set in the first subset that covers it. Ranges
 * copied from the `unicode-range` of @fontsource/ibm-plex-sans and -mono 5.3.0 (index.css).
 */
const SUBSET_RANGES: Record<'latin' | 'latin-ext' | 'greek', Array<[number, number]>> = {
  latin: [
    [0x0000, 0x00ff],
    [0x0131, 0x0131],
    [0x0152, 0x0153],
    [0x02bb, 0x02bc],
    [0x02c6, 0x02c6],
    [0x02da, 0x02da],
    [0x02dc, 0x02dc],
    [0x0304, 0x0304],
    [0x0308, 0x0308],
    [0x0329, 0x0329],
    [0x2000, 0x206f],
    [0x20ac, 0x20ac],
    [0x2122, 0x2122],
    [0x2191, 0x2191],
    [0x2193, 0x2193],
    [0x2212, 0x2212],
    [0x2215, 0x2215],
    [0xfeff, 0xfeff],
    [0xfffd, 0xfffd],
  ],
  'latin-ext': [
    [0x0100, 0x02ba],
    [0x02bd, 0x02c5],
    [0x02c7, 0x02cc],
    [0x02ce, 0x02d7],
    [0x02dd, 0x02ff],
    [0x0304, 0x0304],
    [0x0308, 0x0308],
    [0x0329, 0x0329],
    [0x1d00, 0x1dbf],
    [0x1e00, 0x1e9f],
    [0x1ef2, 0x1eff],
    [0x2020, 0x2020],
    [0x20a0, 0x20ab],
    [0x20ad, 0x20c0],
    [0x2113, 0x2113],
    [0x2c60, 0x2c7f],
    [0xa720, 0xa7ff],
  ],
  greek: [
    [0x0370, 0x0377],
    [0x037a, 0x037f],
    [0x0384, 0x038a],
    [0x038c, 0x038c],
    [0x038e, 0x03a1],
    [0x03a3, 0x03ff],
  ],
};

type Subset = keyof typeof SUBSET_RANGES;

interface FontFace {
  /** The name registered with pdfkit. */
  name: string;
  file: string;
  subset: Subset;
  /** Code points this file draws wrongly although its subset range covers them. */
  skip?: readonly number[];
}

/**
 * WOFF 1 files, not the client's WOFF2: fontkit (under pdfkit 0.20) fails to subset WOFF2
 * glyphs ("Offset is outside the bounds of the DataView"); the same @fontsource 5.3.0 faces
 * ship as .woff beside the .woff2 in fonts/, under the same OFL. The Mono .woff fails the
 * same way on its blank glyphs (space, no-break space, soft hyphen), and so do glyphs a
 * subset lacks: those characters are set in Sans Latin, whose file has none of these faults.
 *
 * Chains per role, first match wins; the fallback takes what no face of the chain covers.
 */
const FACES: Record<FontRole, FontFace[]> = {
  regular: chain('ibm-plex-sans', 400, ['latin', 'latin-ext', 'greek']),
  medium: chain('ibm-plex-sans', 500, ['latin', 'latin-ext', 'greek']),
  bold: chain('ibm-plex-sans', 600, ['latin', 'latin-ext', 'greek']),
  mono: [
    ...chain('ibm-plex-mono', 400, ['latin', 'latin-ext']).map((face) =>
      face.subset === 'latin' ? { ...face, skip: [0x20, 0xa0, 0xad] } : face,
    ),
    ...chain('ibm-plex-sans', 400, ['greek']),
  ],
};

const FALLBACK: Record<FontRole, FontFace> = {
  regular: FACES.regular[0],
  medium: FACES.medium[0],
  bold: FACES.bold[0],
  mono: FACES.regular[0],
};

function chain(family: string, weight: number, subsets: Subset[]): FontFace[] {
  return subsets.map((subset) => ({
    name: `${family}-${subset}-${weight}`,
    file: `${family}-${subset}-${weight}-normal.woff`,
    subset,
  }));
}

export interface TextRun {
  fontName: string;
  text: string;
}

/** What pdfkit needs of a document to take our fonts. */
export interface FontRegistry {
  registerFont(name: string, src: Buffer): unknown;
}

const fileCache = new Map<string, Buffer>();

/** The shipped fonts, read once per folder, and the split of text into covered runs. */
export class ReportFonts {
  private constructor(private readonly files: Map<string, Buffer>) {}

  /** Reads every face from `fontsDir`; a missing file is an error naming it. */
  static load(fontsDir: string = DEFAULT_FONTS_DIR): ReportFonts {
    const files = new Map<string, Buffer>();
    for (const face of Object.values(FACES).flat()) {
      const path = join(fontsDir, face.file);
      let bytes = fileCache.get(path);
      if (bytes === undefined) {
        try {
          bytes = readFileSync(path);
        } catch (error: unknown) {
          const why = errorMessage(error);
          throw new Error(`Report font missing: expected ${path} (${why}).`, { cause: error });
        }
        fileCache.set(path, bytes);
      }
      files.set(face.name, bytes);
    }
    return new ReportFonts(files);
  }

  registerWith(doc: FontRegistry): void {
    for (const [name, bytes] of this.files) doc.registerFont(name, bytes);
  }

  /** The first registered face name of a role (for measuring and default text). */
  primary(role: FontRole): string {
    return FACES[role][0].name;
  }

  /**
   * Splits text into runs each covered by one face. A character no face covers goes to the
   * Sans Latin fallback (it prints as a missing-glyph box rather than vanishing).
   */
  runs(text: string, role: FontRole): TextRun[] {
    const faces = FACES[role];
    const out: TextRun[] = [];
    for (const char of text) {
      const codePoint = char.codePointAt(0) ?? 0;
      const face =
        faces.find((f) => covers(f.subset, codePoint) && !(f.skip ?? []).includes(codePoint)) ??
        FALLBACK[role];
      const last = out[out.length - 1];
      if (last !== undefined && last.fontName === face.name) last.text += char;
      else out.push({ fontName: face.name, text: char });
    }
    return out;
  }
}

function covers(subset: Subset, codePoint: number): boolean {
  return SUBSET_RANGES[subset].some(([low, high]) => codePoint >= low && codePoint <= high);
}
