// Everything the screens show as text goes through here: one date style, one way to write a quantity.
export * from './dates';
export * from './numbers';
export * from './percent';
export * from './quantity';
