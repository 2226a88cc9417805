/**
 * Phase colours: a colour-blind-safe categorical palette. The eight colours are those proposed
 * by M. Okabe and K. Ito, "Color Universal Design (CUD) — How to make figures and
 * presentations that are friendly to colorblind people" (J*Fly, 2002; revised 2008), in an
 * order that puts the most distinct hues first; black is left out (it is our ink) and a warm
 * grey closes the list for "unlabelled". More labels than colours cycle through the list again;
 * the legend always names each label, so colour is never the only cue.
 */
export const PHASE_PALETTE: readonly { name: string; hex: string }[] = [
  { name: 'sky blue', hex: '#56b4e9' },
  { name: 'orange', hex: '#e69f00' },
  { name: 'bluish green', hex: '#009e73' },
  { name: 'reddish purple', hex: '#cc79a7' },
  { name: 'blue', hex: '#0072b2' },
  { name: 'vermillion', hex: '#d55e00' },
  { name: 'yellow', hex: '#f0e442' },
];

/** Colour of points without a label (and of failed points). */
export const UNLABELLED_COLOR = '#bdb6a6';

/**
 * The colour of a phase label: an override stored as an annotation wins; otherwise the label's
 * position in the map's sorted list of labels picks from PHASE_PALETTE.
 */
export function phaseColor(labelId: string | undefined, labels: readonly string[], overrides: Record<string, string> = {}): string {
  if (labelId === undefined) return UNLABELLED_COLOR;
  const chosen = overrides[labelId];
  if (chosen) return chosen;
  const i = labels.indexOf(labelId);
  if (i < 0) return UNLABELLED_COLOR;
  return PHASE_PALETTE[i % PHASE_PALETTE.length].hex;
}

/** Black or white text, whichever reads better on `hex` (WCAG relative luminance). */
export function textOn(hex: string): '#141a2e' | '#ffffff' {
  const m = /^#?([0-9a-f]{6})$/i.exec(hex);
  if (!m) return '#141a2e';
  const n = parseInt(m[1], 16);
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  const L = 0.2126 * lin((n >> 16) & 255) + 0.7152 * lin((n >> 8) & 255) + 0.0722 * lin(n & 255);
  return L > 0.23 ? '#141a2e' : '#ffffff';
}
