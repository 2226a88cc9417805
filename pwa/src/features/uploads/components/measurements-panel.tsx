import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { errorText } from '../../../lib/api-client.js';
import type { MeasurementRow } from '../../maps/lib/measurements.js';
import { useUpload } from '../api/get-upload.js';
import { isMeasurementsSummary, useUploads } from '../api/get-uploads.js';
import { csvProblems, useUploadMeasurements } from '../api/upload-measurements.js';

/**
 * Upload measured data (CSV: parameter columns, observable columns, X_err uncertainties) for a
 * synced map, and pick which upload to draw over the 1D cut. Problems come back with their line.
 */
export function MeasurementsPanel({ projectId, mapId, canUpload, onRows }: { projectId: string; mapId: string; canUpload: boolean; onRows: (rows: MeasurementRow[] | undefined) => void }) {
  const uploads = useUploads(projectId);
  const upload = useUploadMeasurements(projectId);
  const [file, setFile] = useState<File>();
  const [chosen, setChosen] = useState<string>();
  const mine = (uploads.data ?? []).filter((u) => u.kind === 'measurements' && u.mapId === mapId);
  const current = chosen ?? mine[0]?.id;
  const detail = useUpload(projectId, current === '' ? undefined : current);
  const summary = detail.data?.summary;
  useEffect(() => {
    onRows(current && isMeasurementsSummary(summary) ? summary.rows : undefined);
  }, [current, summary, onRows]);
  const problems = csvProblems(upload.error);
  return (
    <div className="space-y-2 rounded-xl border border-line bg-surface p-4 text-sm" data-testid="measurements">
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-semibold text-ink-700">Measured data:</span>
        <select className="rounded border border-line px-2 py-1" value={current ?? ''} onChange={(e) => setChosen(e.target.value)} data-testid="measurements-choice">
          <option value="">none on the cut</option>
          {mine.map((u) => (
            <option key={u.id} value={u.id}>
              {u.fileName} ({new Date(u.createdAt).toLocaleDateString()})
            </option>
          ))}
        </select>
        {canUpload ? (
          <form
            className="flex flex-wrap items-center gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (file) upload.mutate({ file, mapId }, { onSuccess: (u) => setChosen(u.id) });
            }}
          >
            <input type="file" accept=".csv,text/csv" onChange={(e) => setFile(e.target.files?.[0])} data-testid="measurements-file" />
            <Button type="submit" variant="secondary" disabled={!file || upload.isPending} data-testid="measurements-upload">
              Upload CSV
            </Button>
          </form>
        ) : null}
      </div>
      <p className="text-xs text-ink-600">Columns: the swept parameters, any observable (e.g. density), and X_err for the uncertainty of X. Drawn as red squares with error bars on the 1D cut of the same observable.</p>
      {upload.error ? (
        <div role="alert" className="text-red-800" data-testid="measurements-error">
          <p>{errorText(upload.error)}</p>
          {problems.length ? (
            <ul className="list-inside list-disc">
              {problems.map((p, i) => (
                <li key={i}>
                  {p.line !== null ? `line ${p.line}` : 'file'}
                  {p.column !== null ? `, column ${p.column}` : ''}: {p.problem}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {uploads.error ? <p className="text-red-800">{errorText(uploads.error)}</p> : null}
      {isMeasurementsSummary(summary) ? (
        <p className="text-xs text-ink-700" data-testid="measurements-summary">
          {summary.rows.length} rows · parameters {summary.parameters.join(', ')} · observables {summary.observables.map((o) => `${o.name}${o.uncertainty ? ' ± err' : ''}`).join(', ')}
        </p>
      ) : null}
    </div>
  );
}
