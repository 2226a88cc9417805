/**
 * Exports a plot (an <svg> element on the page) as a stand-alone SVG file with the Manrope font
 * embedded as a data URL (@font-face), and as a PNG rendered from that SVG at print resolution.
 * Plots draw their ink through CSS variables (they follow the page's theme); a file gets the
 * light theme's colours written in, so it reads the same in any viewer and on paper.
 */
import manrope400 from '@fontsource/manrope/files/manrope-latin-400-normal.woff2?inline';
import manrope600 from '@fontsource/manrope/files/manrope-latin-600-normal.woff2?inline';
import { withLightColors } from './plot-colors.js';

const FONT_CSS = `@font-face{font-family:'Manrope';font-style:normal;font-weight:400;src:url(${manrope400}) format('woff2');}
@font-face{font-family:'Manrope';font-style:normal;font-weight:600;src:url(${manrope600}) format('woff2');}
svg{font-family:'Manrope',sans-serif;}`;

/** The SVG's markup as a file: namespaces, explicit size, white paper and the embedded font. */
export function svgDocument(svg: SVGSVGElement, width = svg.viewBox.baseVal?.width || svg.clientWidth || 600, height = svg.viewBox.baseVal?.height || svg.clientHeight || 400): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  clone.setAttribute('width', String(width));
  clone.setAttribute('height', String(height));
  clone.setAttribute('font-family', 'Manrope, sans-serif');
  if (!clone.getAttribute('viewBox')) clone.setAttribute('viewBox', `0 0 ${width} ${height}`);
  const ns = 'http://www.w3.org/2000/svg';
  const style = document.createElementNS(ns, 'style');
  style.textContent = FONT_CSS;
  const bg = document.createElementNS(ns, 'rect');
  bg.setAttribute('width', '100%');
  bg.setAttribute('height', '100%');
  bg.setAttribute('fill', '#ffffff');
  clone.insertBefore(bg, clone.firstChild);
  clone.insertBefore(style, clone.firstChild);
  return `<?xml version="1.0" encoding="UTF-8"?>\n${withLightColors(new XMLSerializer().serializeToString(clone))}\n`;
}

export function download(blob: Blob, filename: string) {
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 2000);
}

export function exportSvg(svg: SVGSVGElement, filename: string): string {
  const text = svgDocument(svg);
  download(new Blob([text], { type: 'image/svg+xml' }), filename);
  return text;
}

/** PNG at `scale` × the SVG's size (3 × a 600-px plot ≈ 1800 px, 300 dpi at 15 cm). */
export async function exportPng(svg: SVGSVGElement, filename: string, scale = 3): Promise<void> {
  const width = svg.viewBox.baseVal?.width || svg.clientWidth || 600;
  const height = svg.viewBox.baseVal?.height || svg.clientHeight || 400;
  const url = URL.createObjectURL(new Blob([svgDocument(svg, width, height)], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('the plot could not be rendered as an image'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(width * scale);
    canvas.height = Math.round(height * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('no 2D canvas');
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, width, height);
    const blob = await new Promise<Blob | null>((r) => canvas.toBlob(r, 'image/png'));
    if (!blob) throw new Error('PNG encoding failed');
    download(blob, filename);
  } finally {
    URL.revokeObjectURL(url);
  }
}
