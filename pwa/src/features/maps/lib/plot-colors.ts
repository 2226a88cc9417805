/**
 * Plot ink as CSS variables, so figures follow the page's theme (light or dark; see
 * src/index.css). Exported figures are always light: `lightThemeColors` reads the light values
 * from the stylesheet's @theme block and export-figure.ts writes them in place of the variables.
 */
import themeCss from '../../../index.css?raw';

export const PLOT = {
  ink: 'var(--color-ink-900)',
  accent: 'var(--color-accent-600)',
  surface: 'var(--color-surface)',
  paper: 'var(--color-paper)',
  /** Points drawn from an upload (measured data). */
  measured: 'var(--color-measured)',
  /** Diverging scales: draw with fill-opacity ∝ |value| so zero is the ground. */
  negative: 'var(--color-diverge-neg)',
  positive: 'var(--color-diverge-pos)',
} as const;

/** Colour and opacity of a signed value on the diverging scale, |value| ≥ `max` fully saturated at `strongest`. */
export function diverging(value: number, max: number, strongest = 0.85): { fill: string; fillOpacity: number } {
  const t = max > 0 ? Math.max(-1, Math.min(1, value / max)) : 0;
  return { fill: t >= 0 ? PLOT.positive : PLOT.negative, fillOpacity: +(Math.abs(t) * strongest).toFixed(3) };
}

/** `--color-*` values of the first `@theme { … }` block of a stylesheet (the light theme). */
export function themeColors(css: string): Record<string, string> {
  const block = /@theme(?:\s+[a-z]+)*\s*\{([^}]*)\}/.exec(css)?.[1] ?? '';
  const out: Record<string, string> = {};
  for (const m of block.matchAll(/(--color-[a-z0-9-]+)\s*:\s*([^;]+);/g)) out[m[1]] = m[2].trim();
  return out;
}

let light: Record<string, string> | null = null;

export function lightThemeColors(): Record<string, string> {
  return (light ??= themeColors(themeCss));
}

/** Replaces `var(--name)` by the light theme's value (unknown names are left as they are). */
export function withLightColors(text: string, colors: Record<string, string> = lightThemeColors()): string {
  return text.replace(/var\((--[a-z0-9-]+)\)/g, (whole, name: string) => colors[name] ?? whole);
}
