// Colours from the design tokens, for charts (SVG needs the values).
export const C = {
  ink: '#0b161d',
  ink600: '#435762',
  ink300: '#a9b6bc',
  ink100: '#e3e8e8',
  fjord: '#005264',
  fjord100: '#d6ebef',
  alarm: '#a3190f',
  okay: '#15613a',
  heed: '#7a4300',
  lime: '#a9d62e',
  paper: '#f3f4ee',
};
