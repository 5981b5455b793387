import { z } from 'zod';

/*
 * Text people type into names and descriptions. Control characters (C0 and C1, except none) and
 * the Unicode bidirectional embedding, override and isolate controls (U+202A–U+202E,
 * U+2066–U+2069; Unicode Standard Annex #9, section 2) are refused: they can make a name display as
 * something other than what it is ("Trojan Source", CVE-2021-42574) and break CSV and e-mail.
 */
// eslint-disable-next-line no-control-regex -- the control characters are exactly what is refused
const UNSAFE_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

/** Trimmed single-line text of 1…max characters without control or bidirectional-override characters. */
export function plainText(max: number) {
  return z
    .string()
    .trim()
    .min(1)
    .max(max)
    .refine((value) => !UNSAFE_CHARACTERS.test(value), {
      message: 'must not contain control characters or bidirectional-override characters',
    });
}
