import type { Database } from '../db/database';
import type { ShortageDto } from '../../shared/schemas/line-risk';
import { formatDay } from '../../shared/format/dates';
import { formatQuantity } from '../../shared/format/quantity';
import { resequenceSentence } from '../../shared/format/rescue-words';
import { recordAudit } from '../audit/audit.service';
import { enqueueMail } from '../outbox/outbox.service';
import { readSetting, writeSetting } from '../settings/settings';
import { UserEntity } from '../users/user.entity';
import type { LineRiskService } from './line-risk.service';

/** Part number → first short date already reported to the planners. */
const ALERTED = 'lineRisk.frozenWindowAlerts';

function alertText(shortages: ShortageDto[], appUrl: string): string {
  const blocks = shortages.map((shortage) => {
    const units = shortage.slotsAtRisk
      .slice(0, 10)
      .map((slot) => `    ${formatDay(slot.date)} position ${slot.sequence}: ${slot.serial} (${slot.model})`);
    const more = shortage.slotsAtRiskCount > 10 ? [`    … and ${shortage.slotsAtRiskCount - 10} more units`] : [];
    const resequence = shortage.rescue.resequence ? [`  Or: ${resequenceSentence(shortage.rescue.resequence)}`] : [];
    return [
      `${shortage.partNumber} ${shortage.description}${shortage.hazardous ? ' [hazardous goods]' : ''}`,
      `  Short from ${formatDay(shortage.firstShortDate)} by ${formatQuantity(shortage.shortQty, shortage.uom)}; ${shortage.slotsAtRiskCount} units cannot be built:`,
      ...units,
      ...more,
      ...actionLines(shortage),
      ...resequence,
    ].join('\n');
  });
  return [
    'These parts now run short inside the frozen window of the build sequence:',
    '',
    blocks.join('\n\n'),
    '',
    `Line risk: ${appUrl}/line-risk`,
  ].join('\n');
}

function actionLines(shortage: ShortageDto): string[] {
  const supplier = shortage.supplierName ?? shortage.supplierCode ?? 'the supplier';
  if (shortage.action === 'loop' && shortage.loop) {
    return [
      `  The kanban loop cannot keep up: ${shortage.loop.activeCards} cards in circulation, ${shortage.loop.recommendedCards} needed. Add cards on the Loops page.`,
    ];
  }
  if (shortage.action === 'count') return ['  Its on-hand is negative or due a count: count it before expediting.'];
  const awaiting = shortage.awaitingConfirmation;
  return [
    ...(awaiting
      ? [
          `  Already asked for: ${formatQuantity(awaiting.qty, shortage.uom)} on ${awaiting.releaseNumbers.join(', ')}, not yet confirmed by ${supplier}. Chase that confirmation first.`,
        ]
      : []),
    `  Expedite from ${supplier}: ${shortage.needBy.map((entry) => `${formatQuantity(entry.qty, shortage.uom)} by ${formatDay(entry.date)}`).join(', ')}.`,
  ];
}

/**
 * E-mails the planners once when a part's shortage enters the frozen window (again only if its
 * first short date moves); a part that leaves the window may alert again later. Returns the
 * part numbers newly reported.
 */
export async function alertFrozenWindowShortages(
  db: Database,
  lineRisk: LineRiskService,
  appUrl: string,
): Promise<string[]> {
  // One node checks at a time; the others skip this round (the next one is minutes away).
  return (await db.runAlone('frozen-window-check', () => alertOnce(db, lineRisk, appUrl))) ?? [];
}

async function alertOnce(db: Database, lineRisk: LineRiskService, appUrl: string): Promise<string[]> {
  // A shortage the normal release covers is no alarm, whatever its date.
  const inWindow = (await lineRisk.shortages()).filter(
    (shortage) => shortage.inFrozenWindow && shortage.action !== 'release',
  );
  return db.write(async (manager) => {
    const alerted = await readSetting<Record<string, string>>(manager, ALERTED, {});
    const fresh = inWindow.filter((shortage) => alerted[shortage.partNumber] !== shortage.firstShortDate);
    const stillAlerted = Object.fromEntries(inWindow.map((shortage) => [shortage.partNumber, shortage.firstShortDate]));
    await writeSetting(manager, ALERTED, stillAlerted);
    if (fresh.length === 0) return [];
    const planners = await manager.find(UserEntity, { where: { role: 'planner', active: true } });
    const subject =
      fresh.length === 1
        ? `Line stop ahead: ${fresh[0].partNumber} short on ${formatDay(fresh[0].firstShortDate)}, inside the frozen window`
        : `Line stop ahead: ${fresh.length} parts short inside the frozen window`;
    for (const planner of planners)
      await enqueueMail(manager, { to: planner.email, subject, text: alertText(fresh, appUrl) });
    await recordAudit(manager, {
      actorEmail: null,
      action: 'alert',
      entity: 'line-risk',
      entityKey: 'frozen-window',
      changes: {
        parts: fresh.map((shortage) => shortage.partNumber),
        planners: planners.map((planner) => planner.email),
      },
    });
    return fresh.map((shortage) => shortage.partNumber);
  });
}
