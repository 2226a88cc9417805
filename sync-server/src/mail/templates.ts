/** Plain-text and HTML bodies of every message the server sends. */
export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ESCAPES[c]!);
}

function layout(title: string, paragraphs: string[], action?: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  const button = action
    ? `<p><a href="${escapeHtml(action.url)}" style="display:inline-block;padding:10px 16px;background:#1d4ed8;color:#fff;text-decoration:none;border-radius:6px">${escapeHtml(action.label)}</a></p>\n<p style="font-size:12px;color:#555">Or open this address: ${escapeHtml(action.url)}</p>`
    : '';
  return `<!doctype html>
<html><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="font-family:system-ui,sans-serif;line-height:1.5;color:#111;max-width:560px">
<h1 style="font-size:18px">${escapeHtml(title)}</h1>
${body}
${button}
<p style="font-size:12px;color:#555">Sent by Phasewright.</p>
</body></html>`;
}

const date = (d: Date) => d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

export function invitationMail(input: { projectName: string; inviterName: string; role: string; link: string; expiresAt: Date }): RenderedMail {
  const title = `${input.inviterName} invites you to "${input.projectName}" on Phasewright`;
  const lines = [
    `${input.inviterName} invites you to join the project "${input.projectName}" as ${input.role}.`,
    `The link works once and until ${date(input.expiresAt)}. If you have no account yet, you can create one when you accept.`,
  ];
  return {
    subject: title,
    text: `${lines.join('\n\n')}\n\nAccept the invitation: ${input.link}\n\nIf you did not expect this message, ignore it.\n`,
    html: layout(title, [...lines, 'If you did not expect this message, ignore it.'], { label: 'Accept the invitation', url: input.link }),
  };
}

export function passwordResetMail(input: { displayName: string; link: string; expiresAt: Date }): RenderedMail {
  const title = 'Reset your Phasewright password';
  const lines = [
    `Hello ${input.displayName}, someone (hopefully you) asked to reset the password of this account.`,
    `The link works once and until ${date(input.expiresAt)}. Resetting signs out every device.`,
  ];
  return {
    subject: title,
    text: `${lines.join('\n\n')}\n\nChoose a new password: ${input.link}\n\nIf you did not ask for this, ignore this message; your password stays as it is.\n`,
    html: layout(title, [...lines, 'If you did not ask for this, ignore this message; your password stays as it is.'], {
      label: 'Choose a new password',
      url: input.link,
    }),
  };
}

export function invitationAcceptedMail(input: { ownerName: string; memberName: string; memberEmail: string; projectName: string; role: string; link: string }): RenderedMail {
  const title = `${input.memberName} joined "${input.projectName}"`;
  const lines = [
    `Hello ${input.ownerName}, ${input.memberName} <${input.memberEmail}> accepted the invitation and joined "${input.projectName}" as ${input.role}.`,
    'As an owner you can change their role or remove them on the project\'s members page.',
  ];
  return {
    subject: title,
    text: `${lines.join('\n\n')}\n\nOpen the project: ${input.link}\n`,
    html: layout(title, lines, { label: 'Open the project', url: input.link }),
  };
}
