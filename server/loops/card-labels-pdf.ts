import PDFDocument from 'pdfkit';
import { qrPng, type CardLabelContent } from './card-labels';
import { UNIT_WORDS } from '../../shared/schemas/master-data';

// A4 portrait in points (ISO 216: 210 × 297 mm), cut into a 2 × 4 grid of cards of about
// 92 × 66 mm — big enough to read at arm's length in a rack, small enough for a card sleeve.
const PAGE = { width: 595.28, height: 841.89 };
const MARGIN = 28;
const GAP = 12;
const COLUMNS = 2;
const ROWS = 4;
const LABEL_WIDTH = (PAGE.width - 2 * MARGIN - (COLUMNS - 1) * GAP) / COLUMNS;
const LABEL_HEIGHT = (PAGE.height - 2 * MARGIN - (ROWS - 1) * GAP) / ROWS;
const PADDING = 10;
const QR_SIZE = 92;
const INK = '#1a1a1a';
const MUTED = '#5c5c5c';

function quantityText(label: CardLabelContent): string {
  const unit = UNIT_WORDS[label.uom];
  return `${label.containerQty} ${unit ?? label.uom}`;
}

function sourceText(label: CardLabelContent): string {
  if (label.kind === 'supermarket') return 'Made in-house (supermarket)';
  if (!label.supplierCode) return 'No supplier';
  return label.supplierName ? `${label.supplierCode} · ${label.supplierName}` : label.supplierCode;
}

function field(doc: PDFKit.PDFDocument, caption: string, value: string, x: number, y: number, width: number): void {
  doc.font('Helvetica').fontSize(7).fillColor(MUTED).text(caption.toUpperCase(), x, y, { width, lineBreak: false });
  doc
    .font('Helvetica-Bold')
    .fontSize(9.5)
    .fillColor(INK)
    .text(value, x, y + 8, { width, height: 12, ellipsis: true, lineBreak: false });
}

function drawLabel(doc: PDFKit.PDFDocument, label: CardLabelContent, qr: Buffer, x: number, y: number): void {
  const left = x + PADDING;
  const innerWidth = LABEL_WIDTH - 2 * PADDING;
  const textWidth = innerWidth - QR_SIZE - 8;
  const kindCaption = label.kind === 'supplier' ? 'Supplier loop' : 'Supermarket loop';

  doc.lineWidth(1.2).strokeColor(INK).roundedRect(x, y, LABEL_WIDTH, LABEL_HEIGHT, 6).stroke();

  doc.font('Helvetica').fontSize(7.5).fillColor(MUTED);
  doc.text(`${kindCaption.toUpperCase()} · LOOP ${label.loopId}`, left, y + PADDING, {
    width: textWidth,
    lineBreak: false,
  });
  doc
    .font('Helvetica-Bold')
    .fontSize(22)
    .fillColor(INK)
    .text(label.partNumber, left, y + PADDING + 11, { width: textWidth, height: 26, ellipsis: true, lineBreak: false });
  doc
    .font('Helvetica')
    .fontSize(8.5)
    .fillColor(INK)
    .text(label.description, left, y + PADDING + 38, { width: textWidth, height: 21, ellipsis: true });

  const fieldsTop = y + PADDING + 62;
  field(doc, 'Point of use', label.pointOfUse ?? '—', left, fieldsTop, textWidth);
  field(doc, 'From', sourceText(label), left, fieldsTop + 23, textWidth);
  field(doc, 'Container', quantityText(label), left, fieldsTop + 46, textWidth);

  doc.image(qr, x + LABEL_WIDTH - PADDING - QR_SIZE, y + PADDING, { width: QR_SIZE, height: QR_SIZE });
  doc
    .font('Helvetica-Bold')
    .fontSize(11)
    .fillColor(INK)
    .text(`card ${label.position} of ${label.count}`, x + LABEL_WIDTH - PADDING - QR_SIZE, y + PADDING + QR_SIZE + 6, {
      width: QR_SIZE,
      align: 'center',
      lineBreak: false,
    });

  const footerTop = y + LABEL_HEIGHT - PADDING - 16;
  doc
    .lineWidth(0.5)
    .strokeColor(MUTED)
    .moveTo(left, footerTop - 6)
    .lineTo(left + innerWidth, footerTop - 6)
    .stroke();
  doc.font('Courier-Bold').fontSize(14).fillColor(INK).text(label.cardNumber, left, footerTop, { lineBreak: false });
  const note = label.retired ? 'WITHDRAWN' : label.hazardous ? 'HAZARDOUS MATERIAL' : '';
  if (note) {
    doc
      .font('Helvetica-Bold')
      .fontSize(8)
      .fillColor(INK)
      .text(note, left, footerTop + 3, { width: innerWidth, align: 'right', lineBreak: false });
  }
}

/** A4 pages of card labels, eight to a page, each with its QR code; resolves to the PDF bytes. */
export async function renderCardLabelsPdf(labels: CardLabelContent[], title: string): Promise<Buffer> {
  const qrCodes = await Promise.all(labels.map((label) => qrPng(label.cardNumber)));
  const doc = new PDFDocument({
    size: 'A4',
    margin: 0,
    autoFirstPage: false,
    info: { Title: title, Creator: 'Cardloop' },
  });
  const chunks: Buffer[] = [];
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const perPage = COLUMNS * ROWS;
  if (labels.length === 0) {
    doc.addPage();
    doc.font('Helvetica').fontSize(12).fillColor(INK).text(`${title}: no cards to print.`, MARGIN, MARGIN);
  }
  labels.forEach((label, index) => {
    const slot = index % perPage;
    if (slot === 0) doc.addPage();
    const column = slot % COLUMNS;
    const row = Math.floor(slot / COLUMNS);
    drawLabel(doc, label, qrCodes[index], MARGIN + column * (LABEL_WIDTH + GAP), MARGIN + row * (LABEL_HEIGHT + GAP));
  });
  doc.end();
  return finished;
}
