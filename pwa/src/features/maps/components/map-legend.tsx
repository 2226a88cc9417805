/** The legend of phase labels: each can be renamed and recoloured (stored as annotations). */
import { useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { PHASE_PALETTE } from '../../../lib/phase-colors.js';

export interface LegendEntry {
  labelId: string;
  name: string;
  color: string;
  count: number;
}

interface Props {
  entries: LegendEntry[];
  /** Absent: read-only legend. */
  onRename?: (labelId: string, name: string) => void;
  onRecolor?: (labelId: string, color: string) => void;
}

export function MapLegend({ entries, onRename, onRecolor }: Props) {
  const [editing, setEditing] = useState<string | null>(null);
  const [text, setText] = useState('');
  const [picking, setPicking] = useState<string | null>(null);
  if (entries.length === 0) return <p className="text-sm text-ink-600">No phase labels on these points.</p>;
  return (
    <ul className="space-y-1.5" aria-label="Phase labels">
      {entries.map((e) => (
        <li key={e.labelId} className="flex flex-wrap items-center gap-2 text-sm" data-label={e.labelId}>
          {onRecolor ? (
            <button
              type="button"
              className="size-5 shrink-0 rounded ring-1 ring-ink-900/30"
              style={{ background: e.color }}
              aria-label={`Change the colour of ${e.name}`}
              onClick={() => setPicking(picking === e.labelId ? null : e.labelId)}
            />
          ) : (
            <span className="size-5 shrink-0 rounded ring-1 ring-ink-900/30" style={{ background: e.color }} aria-hidden="true" />
          )}
          {editing === e.labelId ? (
            <form
              className="flex gap-1.5"
              onSubmit={(ev) => {
                ev.preventDefault();
                if (text.trim()) onRename?.(e.labelId, text.trim());
                setEditing(null);
              }}
            >
              <input
                autoFocus
                aria-label={`New name for ${e.name}`}
                className="w-40 rounded border border-line bg-surface px-1.5 py-0.5"
                value={text}
                onChange={(ev) => setText(ev.target.value)}
              />
              <Button type="submit" className="!px-2 !py-0.5">
                Save
              </Button>
              <Button variant="ghost" className="!px-2 !py-0.5" onClick={() => setEditing(null)}>
                Cancel
              </Button>
            </form>
          ) : (
            <>
              <span className="font-semibold text-ink-900" data-testid="legend-name">
                {e.name}
              </span>
              {e.name !== e.labelId ? <span className="text-xs text-ink-500">({e.labelId})</span> : null}
              <span className="text-xs text-ink-600">{e.count} points</span>
              {onRename ? <button
                type="button"
                className="text-xs font-semibold text-accent-700 underline underline-offset-2"
                onClick={() => {
                  setText(e.name);
                  setEditing(e.labelId);
                }}
                aria-label={`Rename ${e.name}`}
              >
                Rename
              </button> : null}
            </>
          )}
          {picking === e.labelId ? (
            <span className="flex w-full gap-1 pl-7" role="group" aria-label={`Colours for ${e.name}`}>
              {PHASE_PALETTE.map((c) => (
                <button
                  key={c.hex}
                  type="button"
                  title={c.name}
                  aria-label={c.name}
                  className="size-5 rounded ring-1 ring-ink-900/30"
                  style={{ background: c.hex }}
                  onClick={() => {
                    onRecolor?.(e.labelId, c.hex);
                    setPicking(null);
                  }}
                />
              ))}
            </span>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
