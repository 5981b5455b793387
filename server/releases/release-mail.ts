import { safetyNotes, SAFETY_DEFERRAL } from '../../shared/domain/part-safety';
import { unitWord } from '../../shared/schemas/master-data';
import type { OutgoingMail } from '../outbox/outbox.service';
import { formatQty } from '../../shared/format/quantity';

export const HAZARDOUS_NOTE = 'Hazardous goods: pack and ship under the applicable dangerous-goods rules.';
export const EXPEDITE_NOTE =
  'Expedite: needed sooner than your usual lead time; tell us the earliest date you can ship.';

export interface ReleaseMailLine {
  partNumber: string;
  description: string;
  qty: number;
  uom: string;
  needDate: string;
  hazardous: boolean;
  /** Needed sooner than the supplier's lead time: said on the line, in words. */
  expedite: boolean;
  unNumber?: string | null;
  hazardClass?: string | null;
  unitWeightKg?: number | null;
  heavyLift?: boolean;
}

export interface ReleaseMailContent {
  number: string;
  releaseDate: string;
  supplierName: string;
  supplierEmail: string;
  plantName: string;
  lines: ReleaseMailLine[];
  /** Working days the goods spend on the road: the need date is at our dock, so shipping is earlier. */
  transitDays: number;
  link: string;
  expiresAt: string;
  /** True when the buyer sends the release again with a fresh link. */
  resent: boolean;
}

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (char) => `&#${char.charCodeAt(0)};`);
}

/**
 * The handling notes of each part, said once: on the first line that names the part (a part due on
 * several days has several lines).
 */
function notesByLine(lines: ReleaseMailLine[]): Map<number, string[]> {
  const notes = new Map(safetyNotes(lines).map((note) => [note.partNumber, note]));
  const byLine = new Map<number, string[]>();
  lines.forEach((line, index) => {
    const note = notes.get(line.partNumber);
    if (!note) return;
    notes.delete(line.partNumber);
    const said: string[] = [];
    if (note.hazard)
      said.push(note.hazard === 'hazardous material' ? HAZARDOUS_NOTE : `${HAZARDOUS_NOTE} (${note.hazard})`);
    if (note.lift)
      said.push(
        `Heavy (${note.lift.replace(/^heavy:? ?/, '') || 'over a one-person lift'}): pack for lifting equipment.`,
      );
    byLine.set(index, said);
  });
  return byLine;
}

function textTable(lines: ReleaseMailLine[]): string[] {
  const rows = lines.map((line) => [
    line.partNumber,
    line.description,
    formatQty(line.qty),
    unitWord(line.uom, line.qty),
    line.needDate,
  ]);
  const header = ['Part', 'Description', 'Qty', 'Unit', 'At our dock by'];
  const widths = header.map((title, column) => Math.max(title.length, ...rows.map((row) => row[column].length)));
  const format = (cells: string[]) =>
    cells
      .map((cell, column) => (column === 2 ? cell.padStart(widths[column]) : cell.padEnd(widths[column])))
      .join('  ')
      .trimEnd();
  const out = [format(header), widths.map((width) => '-'.repeat(width)).join('  ')];
  const notes = notesByLine(lines);
  lines.forEach((_line, index) => {
    out.push(format(rows[index]));
    if (lines[index]!.expedite) out.push(`  ! ${EXPEDITE_NOTE}`);
    for (const note of notes.get(index) ?? []) out.push(`  ! ${note}`);
  });
  if (notes.size > 0) out.push('', SAFETY_DEFERRAL);
  return out;
}

function htmlTable(lines: ReleaseMailLine[]): string {
  const cell = 'padding:4px 10px;border-bottom:1px solid #e4ddd3;text-align:left';
  const notes = notesByLine(lines);
  const rows = lines
    .map((line, index) => {
      const expedite = line.expedite ? `<br><strong style="color:#8a3a00">${escapeHtml(EXPEDITE_NOTE)}</strong>` : '';
      const hazard =
        expedite +
        (notes.get(index) ?? [])
          .map((note) => `<br><strong style="color:#a3300b">&#9888; ${escapeHtml(note)}</strong>`)
          .join('');
      return (
        `<tr><td style="${cell}">${escapeHtml(line.partNumber)}</td><td style="${cell}">${escapeHtml(line.description)}${hazard}</td>` +
        `<td style="${cell};text-align:right">${formatQty(line.qty)}</td><td style="${cell}">${escapeHtml(unitWord(line.uom, line.qty))}</td>` +
        `<td style="${cell}">${line.needDate}</td></tr>`
      );
    })
    .join('');
  const head = ['Part', 'Description', 'Qty', 'Unit', 'At our dock by']
    .map((title) => `<th style="${cell}">${title}</th>`)
    .join('');
  return `<table style="border-collapse:collapse;font-size:14px"><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table>`;
}

/** The release e-mail to a supplier: every line, and the single-use link to confirm or propose changes. */
export function composeReleaseMail(content: ReleaseMailContent): OutgoingMail {
  const validUntil = content.expiresAt.slice(0, 10);
  const subject = `${content.resent ? 'Release (sent again)' : 'Release'} ${content.number} from ${content.plantName}: please confirm`;
  const transit =
    content.transitDays > 0
      ? ` Dates are when the goods must be at our dock: ship ${content.transitDays} working day${content.transitDays === 1 ? '' : 's'} earlier.`
      : ' Dates are when the goods must be at our dock.';
  const intro = `${content.plantName} releases the parts below for delivery (release ${content.number} of ${content.releaseDate}).${transit}`;
  const ask =
    'Please confirm each quantity and ship date, or propose others, on this page — no sign-in needed. ' +
    `The link works once and until ${validUntil}.`;
  const resentNote = content.resent ? 'This replaces the link we sent before; the earlier link no longer works.' : '';
  const text = [
    `Hello ${content.supplierName},`,
    '',
    intro,
    ask,
    content.link,
    ...(resentNote ? ['', resentNote] : []),
    '',
    ...textTable(content.lines),
    '',
    'Thank you.',
    `${content.plantName} materials team (sent by Cardloop)`,
  ].join('\n');
  const html = [
    `<p>Hello ${escapeHtml(content.supplierName)},</p>`,
    `<p>${escapeHtml(intro)}</p>`,
    `<p>${escapeHtml(ask)}</p>`,
    `<p><a href="${escapeHtml(content.link)}" style="display:inline-block;padding:10px 18px;background:#0f5e63;color:#fff;border-radius:6px;text-decoration:none;font-weight:600">Confirm release ${escapeHtml(content.number)}</a></p>`,
    resentNote ? `<p>${escapeHtml(resentNote)}</p>` : '',
    htmlTable(content.lines),
    `<p>Thank you.<br>${escapeHtml(content.plantName)} materials team (sent by Cardloop)</p>`,
  ].join('\n');
  return { to: content.supplierEmail, subject, text, html };
}
