/**
 * Cellarwright's own palette: dusk indigo for structure, honey amber for actions,
 * a quiet parchment background that stays readable under a cellar's dim light.
 */
export const brandColours = {
  primary: '#33304f',
  secondary: '#c0841f',
  accent: '#8a3d55',
  dark: '#1e1c2e',
  positive: '#2e7d4f',
  negative: '#b3261e',
  info: '#2f6690',
  warning: '#d08a10',
};
