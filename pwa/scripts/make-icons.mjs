// Rasterises public/logo-mark.svg into the PNG icons the web app manifest and iOS need.
// Run with `npm run icons -w pwa` after changing the logo; the PNGs are committed.
import { readFile, writeFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { launchFreshContext } from '../../scripts/e2e/browser.mjs';

const publicDir = fileURLToPath(new URL('../public/', import.meta.url));
const svg = await readFile(new URL('logo-mark.svg', `file://${publicDir}`), 'utf8');
const svgDataUrl = `data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`;

/** Background of the maskable icon; the same colour as the logo's tile. */
const TILE = '#1d2640';

const targets = [
  { file: 'icons/icon-192.png', size: 192, inset: 0, background: 'transparent' },
  { file: 'icons/icon-512.png', size: 512, inset: 0, background: 'transparent' },
  { file: 'icons/apple-touch-icon-180.png', size: 180, inset: 0, background: TILE },
  // Maskable icons may be cropped to a circle of 80 % diameter: keep the mark inside it.
  { file: 'icons/icon-maskable-512.png', size: 512, inset: 0.16, background: TILE },
];

const { context, close } = await launchFreshContext({ viewport: { width: 512, height: 512 } });
try {
  const page = await context.newPage();
  for (const { file, size, inset, background } of targets) {
    const pad = Math.round(size * inset);
    await page.setViewportSize({ width: size, height: size });
    await page.setContent(
      `<html><body style="margin:0;background:${background}">` +
        `<img src="${svgDataUrl}" style="display:block;margin:${pad}px;width:${size - 2 * pad}px;height:${size - 2 * pad}px"></body></html>`,
    );
    await page.locator('img').evaluate((img) => img.decode());
    const png = await page.screenshot({ omitBackground: background === 'transparent' });
    await writeFile(new URL(file, `file://${publicDir}`), png);
    console.log(`wrote public/${file} (${size}×${size})`);
  }
} finally {
  await close();
}
