// The words the scale benchmark's invented lots are titled with, and searched for.
export const COLOURS = [
  'amber',
  'cobalt',
  'white',
  'green',
  'red',
  'black',
  'yellow',
  'turquoise',
  'rose',
  'grey',
];
export const WORDS = [
  'chevron',
  'rosetta',
  'millefiori',
  'feather',
  'eye',
  'trade',
  'seed',
  'lampwork',
  'drawn',
  'wound',
];
