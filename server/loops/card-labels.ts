import QRCode from 'qrcode';
import type { CardLabel } from '../../shared/schemas/loops';

/** One label's printed content; the QR image is drawn from `cardNumber` by each renderer. */
export type CardLabelContent = Omit<CardLabel, 'qrSvg'>;

/**
 * Medium error correction survives a scuffed or partly soiled card on the line (about 15 % of the
 * symbol), and a 12-digit number still fits the smallest QR version at that level.
 */
export const QR_OPTIONS = { errorCorrectionLevel: 'M', margin: 1 } as const;

/** Adds the QR code of each card number as SVG markup, so a client print view needs no QR code of its own. */
export async function withQrSvg(labels: CardLabelContent[]): Promise<CardLabel[]> {
  return Promise.all(
    labels.map(async (label) => ({
      ...label,
      qrSvg: await QRCode.toString(label.cardNumber, { ...QR_OPTIONS, type: 'svg' }),
    })),
  );
}

/** The QR code of a card number as a PNG, for embedding in the printable PDF. */
export function qrPng(cardNumber: string): Promise<Buffer> {
  return QRCode.toBuffer(cardNumber, { ...QR_OPTIONS, type: 'png', width: 240 });
}
