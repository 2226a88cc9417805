import { useState } from 'react';
import { Notice } from '../../components/ui/notice.js';
import { useMail } from '../../features/admin/api/get-mail.js';
import { errorText } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';

/** The app's own address for a link in a captured message (links point at the server's public URL). */
function inApp(link: string): string {
  try {
    const u = new URL(link);
    return u.origin === window.location.origin ? `${u.pathname}${u.search}${u.hash}` : link;
  } catch {
    return link;
  }
}

/** /admin/mail — messages the server's fake SMTP store captured (site admins; development and demos). */
export function Component() {
  const session = useSession();
  const [to, setTo] = useState('');
  const mail = useMail(to.trim());
  if (session && session.user.siteRole !== 'admin') return <Notice tone="warn" title="For site admins only">This page lists the e-mails the server captured.</Notice>;
  return (
    <div className="space-y-5">
      <title>Mail · Phasewright</title>
      <div>
        <p className="text-sm font-semibold text-ink-600">Site admin</p>
        <h1 className="text-2xl font-bold tracking-tight text-ink-900">Captured mail</h1>
        <p className="mt-1 text-sm text-ink-700">What the server's built-in SMTP store received (invitations, reset links, notices), newest first.</p>
      </div>
      <input className="w-72 rounded border border-line bg-surface px-2 py-1.5 text-sm" placeholder="Only to addresses containing…" aria-label="Recipient filter" value={to} onChange={(e) => setTo(e.target.value)} />
      {mail.isError ? <Notice tone="error" title="Mail not loaded">{errorText(mail.error)}</Notice> : null}
      {mail.isPending ? <p role="status">Loading…</p> : null}
      <ul className="space-y-3" aria-label="Messages">
        {(mail.data ?? []).map((m) => (
          <li key={m.id} className="rounded-xl bg-surface p-4 ring-1 ring-line" data-mail-to={m.to}>
            <p className="text-xs text-ink-600">
              {new Date(m.receivedAt).toLocaleString()} · to {m.to}
            </p>
            <p className="font-semibold text-ink-900">{m.subject}</p>
            <pre className="mt-2 font-sans text-sm whitespace-pre-wrap text-ink-800">{m.text}</pre>
            {m.links.length ? (
              <ul className="mt-2 space-y-1 text-sm">
                {m.links.map((l) => (
                  <li key={l}>
                    <a className="font-semibold break-all text-accent-700 underline underline-offset-2" href={inApp(l)} data-mail-link="">
                      {l}
                    </a>
                  </li>
                ))}
              </ul>
            ) : null}
          </li>
        ))}
      </ul>
      {mail.data && mail.data.length === 0 ? <p className="text-ink-600">No messages.</p> : null}
    </div>
  );
}
