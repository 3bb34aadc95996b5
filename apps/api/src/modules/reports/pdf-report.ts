import { StreamableFile } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import { attachmentDisposition } from '../../common/csv/csv-writer.js';
import { LATO_BOLD, LATO_REGULAR, printOnlyDrawable } from '../../common/pdf/lato.js';

// A plain printed report: a title, short paragraphs and tables that carry their header onto each new
// page. Lato is embedded from the font files shipped with the API, so the PDF prints the same everywhere.


const MARGIN = 40;
const ROW_GAP = 4;

export interface PdfColumn {
  header: string;
  /** Share of the table width. */
  width: number;
  align?: 'left' | 'right';
}

export class PdfReport {
  private readonly doc: PDFKit.PDFDocument;
  private readonly chunks: Buffer[] = [];
  private readonly done: Promise<Buffer>;

  constructor(title: string, subtitle: string) {
    this.doc = printOnlyDrawable(new PDFDocument({ size: 'LETTER', margin: MARGIN, info: { Title: title, Creator: 'Hitchbook' } }));
    this.doc.registerFont('regular', LATO_REGULAR);
    this.doc.registerFont('bold', LATO_BOLD);
    this.doc.on('data', (chunk: Buffer) => this.chunks.push(chunk));
    this.done = new Promise((resolve) => this.doc.on('end', () => resolve(Buffer.concat(this.chunks))));
    this.doc.font('bold').fontSize(16).text(title);
    this.doc.font('regular').fontSize(10).fillColor('#444444').text(subtitle).fillColor('#000000').moveDown();
  }

  private get width(): number {
    return this.doc.page.width - 2 * MARGIN;
  }

  heading(text: string): this {
    this.ensureRoom(40);
    this.doc.moveDown(0.5).font('bold').fontSize(12).text(text, MARGIN).moveDown(0.3);
    return this;
  }

  paragraph(text: string, size = 9): this {
    this.doc.font('regular').fontSize(size).text(text, MARGIN, undefined, { width: this.width }).moveDown(0.3);
    return this;
  }

  table(columns: readonly PdfColumn[], rows: ReadonlyArray<ReadonlyArray<string>>): this {
    const total = columns.reduce((sum, c) => sum + c.width, 0);
    const widths = columns.map((c) => (c.width / total) * this.width);
    const drawRow = (cells: ReadonlyArray<string>, font: 'regular' | 'bold') => {
      this.doc.font(font).fontSize(8);
      const height = Math.max(...cells.map((cell, i) => this.doc.heightOfString(cell, { width: widths[i]! - 4 })));
      if (this.ensureRoom(height + ROW_GAP) && font === 'regular') drawRow(columns.map((c) => c.header), 'bold');
      const y = this.doc.y;
      let x = MARGIN;
      cells.forEach((cell, i) => {
        this.doc.font(font).fontSize(8).text(cell, x + 2, y, { width: widths[i]! - 4, align: columns[i]!.align ?? 'left' });
        x += widths[i]!;
      });
      this.doc.y = y + height + ROW_GAP;
      if (font === 'bold') this.doc.moveTo(MARGIN, this.doc.y - 2).lineTo(MARGIN + this.width, this.doc.y - 2).lineWidth(0.5).stroke();
    };
    drawRow(columns.map((c) => c.header), 'bold');
    for (const row of rows) drawRow(row, 'regular');
    this.doc.x = MARGIN;
    this.doc.moveDown(0.5);
    return this;
  }

  /** Starts a new page when the next block would not fit; says whether it did. */
  private ensureRoom(height: number): boolean {
    if (this.doc.y + height <= this.doc.page.height - MARGIN) return false;
    this.doc.addPage();
    return true;
  }

  async toFile(filename: string): Promise<StreamableFile> {
    this.doc.end();
    const buffer = await this.done;
    return new StreamableFile(buffer, { type: 'application/pdf', disposition: attachmentDisposition(filename), length: buffer.length });
  }
}
