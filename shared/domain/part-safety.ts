/*
 * What a person handling a part is told, said once per part however many lines name it. The
 * wording points at the plant's own rules: Cardloop cannot know the local codes, the lifting aids
 * on the floor or the protective gear prescribed.
 */

/** The safety data of a part, as the part master holds it. */
export interface PartSafety {
  partNumber: string;
  hazardous: boolean;
  unNumber?: string | null;
  hazardClass?: string | null;
  sdsUrl?: string | null;
  unitWeightKg?: number | null;
  heavyLift?: boolean;
}

/** One part's caution: what makes it hazardous and/or heavy, and where its data sheet is. */
export interface SafetyNote {
  partNumber: string;
  /** e.g. "dangerous goods UN 2800, class 8"; null when the part is not hazardous. */
  hazard: string | null;
  /** e.g. "heavy: 31 kg each"; null when the part is not flagged for heavy lifting. */
  lift: string | null;
  sdsUrl: string | null;
}

/** Said with every caution: the plant's own practice decides how the part is handled. */
export const SAFETY_DEFERRAL =
  'Follow local regulations and the plant’s own safety practice: its handling equipment, lifting aids and protective gear.';

/** What to do about a hazardous part, in general terms. */
export const HAZARD_ADVICE = 'check the packaging for damage or leaks before handling; read the safety data sheet';

/** What to do about a heavy part, in general terms. */
export const LIFT_ADVICE = 'use the lifting aid the plant prescribes; do not lift it alone by hand';

function hazardWords(part: PartSafety): string {
  const parts = [part.unNumber ? `UN ${part.unNumber}` : null, part.hazardClass ? `class ${part.hazardClass}` : null];
  const identity = parts.filter(Boolean).join(', ');
  return identity ? `dangerous goods ${identity}` : 'hazardous material';
}

/** The cautions for the given parts, one per part (first mention wins), only for parts that need one. */
export function safetyNotes(parts: readonly PartSafety[]): SafetyNote[] {
  const seen = new Set<string>();
  const notes: SafetyNote[] = [];
  for (const part of parts) {
    if (seen.has(part.partNumber)) continue;
    seen.add(part.partNumber);
    if (!part.hazardous && !part.heavyLift) continue;
    notes.push({
      partNumber: part.partNumber,
      hazard: part.hazardous ? hazardWords(part) : null,
      lift: part.heavyLift ? (part.unitWeightKg ? `heavy: ${part.unitWeightKg} kg each` : 'heavy') : null,
      sdsUrl: part.sdsUrl ?? null,
    });
  }
  return notes;
}
