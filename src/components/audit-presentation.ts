/*
 * The audit trail records actions and kinds of record as short codes (`kanban_loop`,
 * `reverse-build`); the screen shows them as words.
 */

const WORDS: Record<string, string> = {
  bom: 'BOM',
  'line-risk': 'Line risk',
  seed: 'Demo data loaded',
  scenario: 'Demo scenario',
};

/** An action or kind of record in words: `kanban_loop` → `Kanban loop`. */
export function auditWord(code: string): string {
  const known = WORDS[code];
  if (known) return known;
  const words = code.replace(/[_-]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
