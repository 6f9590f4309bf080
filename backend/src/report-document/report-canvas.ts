import { CHART_COLORS, GYRE_COLORS } from '@gyre/shared/palette';
import PDFDocument from 'pdfkit';
import { FontRole, ReportFonts } from './report-fonts';

/** The PDF's colours by role, from Gyre's one palette (the client's theme reads it too). */
export const REPORT_COLORS = {
  primary: GYRE_COLORS.primary,
  amber: GYRE_COLORS.amber,
  ink: GYRE_COLORS.ink,
  muted: GYRE_COLORS.inkMuted,
  line: GYRE_COLORS.line,
  band: CHART_COLORS.sage,
  second: CHART_COLORS.blue,
} as const;

/** A4 in PostScript points (1/72 in): 210 × 297 mm. */
export const PAGE = {
  widthPt: 595.28,
  heightPt: 841.89,
  marginLeftPt: 56,
  marginRightPt: 56,
  /** Room above the body for the running header. */
  marginTopPt: 72,
  /** Room below the body for the caution and the page number. */
  marginBottomPt: 92,
} as const;

export const BODY_WIDTH_PT = PAGE.widthPt - PAGE.marginLeftPt - PAGE.marginRightPt;

/** pdfkit's page setup for a report page (and for the scratch page blocks are measured on). */
export const PAGE_SETUP = {
  size: 'A4',
  bufferPages: true,
  margins: {
    top: PAGE.marginTopPt,
    bottom: PAGE.marginBottomPt,
    left: PAGE.marginLeftPt,
    right: PAGE.marginRightPt,
  },
} as const;

export interface TextStyle {
  role?: FontRole;
  sizePt?: number;
  color?: string;
}

export interface PlacedTextOptions extends TextStyle {
  /** Wrap inside this width; without it the text is one line. */
  widthPt?: number;
  lineGapPt?: number;
  /** Right-align one line so that it ends at x. */
  alignRight?: boolean;
  /** One line whose baseline (not its top) is at y. */
  onBaseline?: boolean;
}

/**
 * Text and layout over a pdfkit document: every string goes through the font runs (so any
 * script the shipped subsets cover prints), and blocks move to a new page when they would
 * not fit above the footer.
 */
export class ReportCanvas {
  constructor(
    readonly doc: PDFKit.PDFDocument,
    private readonly fonts: ReportFonts,
  ) {}

  get bottomPt(): number {
    return PAGE.heightPt - PAGE.marginBottomPt;
  }

  /** Starts a new page when `heightPt` does not fit below the cursor. */
  ensureSpace(heightPt: number): void {
    if (this.doc.y + heightPt > this.bottomPt) this.doc.addPage();
  }

  /**
   * Draws a block whole on one page: when it would not fit below the cursor, it starts on a
   * new page. Its height is measured by drawing it first on a scratch document from the top
   * of a fresh page (the same code and fonts, so the same line breaks). A block taller than
   * a page is drawn where it is.
   */
  keepTogether(draw: (canvas: ReportCanvas) => void): void {
    const measured = this.measure(draw);
    if (measured.pages === 1 && this.doc.y + measured.heightPt > this.bottomPt) {
      this.doc.addPage();
    }
    draw(this);
  }

  /** Height of a block drawn from the top of a fresh page, and how many pages it took. */
  measure(draw: (canvas: ReportCanvas) => void): { heightPt: number; pages: number } {
    const scratch = new PDFDocument({ ...PAGE_SETUP });
    this.fonts.registerWith(scratch);
    const top = scratch.y;
    draw(new ReportCanvas(scratch, this.fonts));
    const pages = scratch.bufferedPageRange().count;
    const heightPt = scratch.y - top;
    scratch.end();
    return { heightPt, pages };
  }

  widthOf(text: string, style: TextStyle = {}): number {
    const sizePt = style.sizePt ?? 10;
    let width = 0;
    for (const run of this.fonts.runs(text, style.role ?? 'regular')) {
      width += this.doc.font(run.fontName).fontSize(sizePt).widthOfString(run.text);
    }
    return width;
  }

  /** Height of `text` wrapped in `widthPt` (one face is enough to measure lines). */
  heightOf(text: string, widthPt: number, style: TextStyle = {}, lineGapPt = 1.5): number {
    const role = style.role ?? 'regular';
    this.doc.font(this.fonts.primary(role)).fontSize(style.sizePt ?? 10);
    // The Mono file cannot measure a space (see report-fonts.ts); a hyphen has the same
    // advance in a monospaced face and is also a place to break.
    const measured = role === 'mono' ? text.replace(/\s/g, '-') : text;
    return this.doc.heightOfString(measured, { width: widthPt, lineGap: lineGapPt });
  }

  /** Draws text at (x, y); the cursor ends below it. */
  textAt(text: string, xPt: number, yPt: number, options: PlacedTextOptions = {}): void {
    const sizePt = options.sizePt ?? 10;
    const role = options.role ?? 'regular';
    const runs = this.fonts.runs(text, role);
    const x = options.alignRight === true ? xPt - this.widthOf(text, options) : xPt;
    this.doc.fillColor(options.color ?? REPORT_COLORS.ink).fontSize(sizePt);
    const base: PDFKit.Mixins.TextOptions = {
      lineGap: options.lineGapPt ?? 1.5,
      features: ['tnum'],
      ...(options.onBaseline === true ? { baseline: 'alphabetic' } : {}),
      ...(options.widthPt !== undefined
        ? { width: options.widthPt }
        : { lineBreak: false, width: PAGE.widthPt }),
    };
    runs.forEach((run, index) => {
      const continued = index < runs.length - 1;
      this.doc.font(run.fontName);
      if (index === 0) this.doc.text(run.text, x, yPt, { ...base, continued });
      else this.doc.text(run.text, { ...base, continued });
    });
    this.doc.x = PAGE.marginLeftPt;
  }

  /** A wrapped paragraph at the cursor, moved to a new page first when it would not fit. */
  paragraph(text: string, options: PlacedTextOptions & { indentPt?: number } = {}): void {
    const indentPt = options.indentPt ?? 0;
    const widthPt = options.widthPt ?? BODY_WIDTH_PT - indentPt;
    this.ensureSpace(this.heightOf(text, widthPt, options, options.lineGapPt));
    this.textAt(text, PAGE.marginLeftPt + indentPt, this.doc.y, { ...options, widthPt });
  }

  /** Vertical space in points. */
  gap(heightPt: number): void {
    this.doc.y += heightPt;
  }

  heading(text: string): void {
    this.ensureSpace(60);
    this.gap(10);
    this.textAt(text, PAGE.marginLeftPt, this.doc.y, {
      role: 'bold',
      sizePt: 12.5,
      color: REPORT_COLORS.primary,
    });
    const y = this.doc.y + 2;
    this.doc
      .moveTo(PAGE.marginLeftPt, y)
      .lineTo(PAGE.marginLeftPt + BODY_WIDTH_PT, y)
      .lineWidth(0.6)
      .strokeColor(REPORT_COLORS.line)
      .stroke();
    this.doc.y = y + 7;
  }

  /** Label/value rows in two columns; values wrap, labels do not. */
  facts(rows: Array<[string, string, FontRole?]>, labelWidthPt = 170): void {
    const valueWidthPt = BODY_WIDTH_PT - labelWidthPt;
    for (const [label, value, role] of rows) {
      // Identifiers and checksums in Mono, a little smaller so a SHA-256 fits one line.
      const style = { role: role ?? 'regular', sizePt: role === 'mono' ? 8 : 10 } as const;
      const heightPt = Math.max(14, this.heightOf(value, valueWidthPt, style) + 3);
      this.ensureSpace(heightPt);
      const y = this.doc.y;
      this.textAt(label, PAGE.marginLeftPt, y, { sizePt: 10, color: REPORT_COLORS.muted });
      // Smaller Mono sits on the label's baseline.
      const valueY = role === 'mono' ? y + 1.2 : y;
      this.textAt(value, PAGE.marginLeftPt + labelWidthPt, valueY, {
        ...style,
        widthPt: valueWidthPt,
      });
      this.doc.y = Math.max(this.doc.y, y + heightPt);
    }
  }
}
