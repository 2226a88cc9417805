import { useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import type { ConflictRecord } from '../../../lib/db.js';
import { resolveKeepMine, resolveTakeTheirs } from '../../../lib/sync-engine.js';

const WHAT: Record<ConflictRecord['entity'], string> = { model: 'Model', sweep: 'Sweep', label: 'Phase label' };

/** Fields a person edits, shown side by side (spec and ids are not worth a reader's time here). */
function describe(data: Record<string, unknown> | undefined): [string, string][] {
  if (!data) return [];
  return ['name', 'labelId', 'color', 'note'].filter((k) => typeof data[k] === 'string').map((k) => [k, String(data[k])]);
}

/** One stale edit: my version, the server's, and the three ways out. */
export function ConflictCard({ conflict }: { conflict: ConflictRecord }) {
  const [editing, setEditing] = useState(false);
  const mine = describe(conflict.yours);
  const theirs = describe(conflict.theirs?.data);
  const [text, setText] = useState(String(conflict.yours.name ?? conflict.theirs?.data.name ?? ''));
  return (
    <li className="space-y-3 rounded-xl bg-surface p-4 ring-1 ring-red-300" data-conflict={conflict.entityId}>
      <p className="font-semibold text-ink-900">
        {WHAT[conflict.entity]} edited here and on the server
        {conflict.theirs ? ` (server revision ${conflict.theirs.revision}, ${new Date(conflict.theirs.updatedAt).toLocaleString()})` : ' (the server has no such record)'}
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        {[
          ['Mine (this device)', mine],
          ['Theirs (server)', theirs],
        ].map(([title, rows]) => (
          <div key={title as string} className="rounded-lg bg-paper p-3 text-sm">
            <p className="text-xs font-semibold tracking-wide text-ink-600 uppercase">{title as string}</p>
            <dl className="mt-1 grid grid-cols-[6rem_1fr] gap-x-2">
              {(rows as [string, string][]).map(([k, v]) => (
                <div key={k} className="contents">
                  <dt className="text-ink-600">{k}</dt>
                  <dd className="font-semibold text-ink-900" data-side={title === 'Mine (this device)' ? 'mine' : 'theirs'} data-field={k}>
                    {v}
                  </dd>
                </div>
              ))}
            </dl>
          </div>
        ))}
      </div>
      {editing ? (
        <form
          className="flex flex-wrap items-center gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (text.trim()) void resolveKeepMine(conflict.id, { name: text.trim() });
          }}
        >
          <input aria-label="Agreed name" className="w-72 rounded border border-line bg-surface px-2 py-1 text-sm" value={text} onChange={(e) => setText(e.target.value)} autoFocus />
          <Button type="submit">Save and push</Button>
          <Button variant="ghost" onClick={() => setEditing(false)}>
            Cancel
          </Button>
        </form>
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button onClick={() => void resolveKeepMine(conflict.id)}>Keep mine</Button>
          <Button variant="secondary" onClick={() => void resolveTakeTheirs(conflict.id)}>
            Take theirs
          </Button>
          {conflict.entity !== 'sweep' ? (
            <Button variant="secondary" onClick={() => setEditing(true)}>
              Edit a combined name
            </Button>
          ) : null}
        </div>
      )}
    </li>
  );
}
