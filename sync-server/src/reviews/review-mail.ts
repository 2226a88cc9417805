import { escapeHtml, type RenderedMail } from '../mail/templates.js';

/** The notice a reviewer gets when asked to review a map. */
export function reviewRequestMail(input: { requesterName: string; projectName: string; mapName: string; pointCount: number; message: string; link: string }): RenderedMail {
  const title = `${input.requesterName} asks you to review a map in "${input.projectName}"`;
  const lines = [
    `${input.requesterName} asks you to review the map "${input.mapName}" (${input.pointCount} points) in the project "${input.projectName}".`,
    ...(input.message ? [`Their note: ${input.message}`] : []),
    'You can read its full provenance, comment on the map or on single points, run a spot-check, and approve it or ask for changes.',
  ];
  const html = `<!doctype html>
<html><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="font-family:system-ui,sans-serif;line-height:1.5;color:#111;max-width:560px">
<h1 style="font-size:18px">${escapeHtml(title)}</h1>
${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('\n')}
<p><a href="${escapeHtml(input.link)}">Open the review</a></p>
<p style="font-size:12px;color:#555">Or open this address: ${escapeHtml(input.link)}</p>
</body></html>`;
  return { subject: title, text: `${lines.join('\n\n')}\n\nOpen the review: ${input.link}\n`, html };
}
