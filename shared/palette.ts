/**
 * Cellarwright's own palette: dusk indigo for structure, deep honey for actions,
 * a quiet parchment background that stays readable under a cellar's dim light.
 * Every colour that carries white text (buttons, chips, badges) keeps at least 4.5 : 1
 * against white (WCAG 1.4.3), so labels on them stay legible at 12 px.
 */
export const brandColours = {
  primary: '#33304f',
  secondary: '#986215',
  accent: '#8a3d55',
  dark: '#1e1c2e',
  positive: '#2e7d4f',
  negative: '#b3261e',
  info: '#2f6690',
  warning: '#ad4b12',
};
