import { describe, expect, it } from 'vitest';
import { diverging, PLOT, themeColors, withLightColors } from './plot-colors.js';

describe('plot colours for exported figures', () => {
  it('reads the light @theme block of a stylesheet, not the dark overrides after it', () => {
    const css = '@theme static {\n  --font-sans: x;\n  --color-ink-900: #1d2640;\n  --color-paper: #f5f1e8;\n}\n.dark { --color-ink-900: #e6e0d3; }';
    expect(themeColors(css)).toEqual({ '--color-ink-900': '#1d2640', '--color-paper': '#f5f1e8' });
  });

  it('writes light colours in place of var(); unknown variables stay', () => {
    const svg = '<rect fill="var(--color-ink-900)" stroke="var(--color-nope)"/>';
    expect(withLightColors(svg, { '--color-ink-900': '#1d2640' })).toBe('<rect fill="#1d2640" stroke="var(--color-nope)"/>');
  });

  it('diverging scale: sign picks the hue, |value|/max the opacity, clipped at max', () => {
    expect(diverging(-0.5, 2)).toEqual({ fill: PLOT.negative, fillOpacity: expect.closeTo(0.25 * 0.85, 2) });
    expect(diverging(5, 2, 0.9)).toEqual({ fill: PLOT.positive, fillOpacity: 0.9 });
    expect(diverging(0, 0).fillOpacity).toBe(0);
  });
});
