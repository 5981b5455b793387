import { describe, expect, it } from 'vitest';
import { composeReleaseMail, HAZARDOUS_NOTE, type ReleaseMailLine } from '../../server/releases/release-mail';

const battery = {
  partNumber: 'BAT-12',
  description: 'Battery 12 V',
  uom: 'H87',
  hazardous: true,
  unNumber: '2800',
  hazardClass: '8',
  unitWeightKg: 31,
  heavyLift: true,
  expedite: false,
};

const mailOf = (lines: ReleaseMailLine[]) =>
  composeReleaseMail({
    number: 'R261202-FBS',
    releaseDate: '2026-12-02',
    supplierName: 'Supplier F',
    supplierEmail: 'orders@supplier-f.example.com',
    plantName: 'Plant',
    lines,
    link: 'https://cardloop.example.com/confirm/x',
    expiresAt: '2026-12-09T06:00:00.000Z',
    resent: false,
    transitDays: 0,
  });

describe('composeReleaseMail', () => {
  it('says a part’s handling caution once, however many lines name it, with its UN number and weight', () => {
    const mail = mailOf([
      { ...battery, qty: 4, needDate: '2026-12-07' },
      { ...battery, qty: 8, needDate: '2026-12-08' },
      {
        partNumber: 'BRUSH',
        description: 'Brush',
        uom: 'H87',
        hazardous: false,
        expedite: false,
        qty: 10,
        needDate: '2026-12-07',
      },
    ]);

    expect(mail.text.split(HAZARDOUS_NOTE)).toHaveLength(2);
    expect(mail.text).toContain(`${HAZARDOUS_NOTE} (dangerous goods UN 2800, class 8)`);
    expect(mail.text).toContain('Heavy (31 kg each): pack for lifting equipment.');
    expect(mail.text).toContain('the plant’s own safety practice');
    expect((mail.html ?? '').split(HAZARDOUS_NOTE)).toHaveLength(2);
  });

  it('adds no caution to a release without hazardous or heavy parts', () => {
    const mail = mailOf([
      {
        partNumber: 'BRUSH',
        description: 'Brush',
        uom: 'H87',
        hazardous: false,
        expedite: false,
        qty: 10,
        needDate: '2026-12-07',
      },
    ]);

    expect(mail.text).not.toContain(HAZARDOUS_NOTE);
    expect(mail.text).not.toContain('safety practice');
  });
});
