import en from 'element-plus/es/locale/lang/en';

// Words that keep their capitals inside a sentence (abbreviations).
const KEEP_CAPITALS = /^[A-Z]{2,}$/;

/** "Previous Month" → "Previous month": the house writes labels in sentence case. */
export function sentenceCase(text: string): string {
  return text
    .split(' ')
    .map((word, index) => (index === 0 || KEEP_CAPITALS.test(word) ? word : word.toLowerCase()))
    .join(' ');
}

function sentenceCaseAll<T>(messages: T): T {
  if (typeof messages === 'string') return sentenceCase(messages) as T;
  if (Array.isArray(messages)) return messages.map((item: unknown) => sentenceCaseAll(item)) as T;
  if (messages && typeof messages === 'object')
    return Object.fromEntries(Object.entries(messages).map(([key, value]) => [key, sentenceCaseAll(value)])) as T;
  return messages;
}

/** Element Plus's English words in sentence case, for the config provider around the app. */
export const elementLocale = { ...en, el: sentenceCaseAll(en.el) };
