import type { MapPoint } from '@phasewright/physics-core';
import { useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { errorText } from '../../../lib/api-client.js';
import type { MapRecord, PointRow } from '../../../lib/db.js';
import { downloadServerExport, type ServerExport } from '../api/export-map.js';
import { download } from '../lib/export-figure.js';
import { exportFileName, localDataPackage, pointsCsv } from '../lib/map-export.js';

/** Data package, points CSV and methods summary: from the server for a synced map, built here for a local one. */
export function ExportPanel({ map, rows, projectId }: { map: MapRecord; rows: PointRow[]; projectId: string | undefined }) {
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  const points = (): Record<string, MapPoint> => Object.fromEntries(rows.map((r) => [r.key, r.point]));
  const fromServer = async (file: ServerExport) => {
    if (!projectId) return;
    setBusy(true);
    setError(undefined);
    try {
      const { blob, name } = await downloadServerExport(projectId, map.id, file);
      download(blob, name);
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };
  const local = (file: 'package.json' | 'points.csv') => {
    const base = exportFileName(map);
    if (file === 'package.json') download(new Blob([localDataPackage(map, points())], { type: 'application/json' }), `${base}.json`);
    else download(new Blob([pointsCsv(map, points())], { type: 'text/csv' }), `${base}-points.csv`);
  };
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="map-exports">
      <span className="font-semibold text-ink-700">Export:</span>
      <Button variant="secondary" disabled={busy} onClick={() => (projectId ? void fromServer('package.json') : local('package.json'))} data-testid="export-package">
        Data package (JSON)
      </Button>
      <Button variant="secondary" disabled={busy} onClick={() => (projectId ? void fromServer('points.csv') : local('points.csv'))} data-testid="export-csv">
        Points (CSV)
      </Button>
      {projectId ? (
        <Button variant="secondary" disabled={busy} onClick={() => void fromServer('methods.txt')} data-testid="export-methods">
          Methods summary
        </Button>
      ) : (
        <span className="text-xs text-ink-600">The methods summary is written by the server once the map is synced to a project.</span>
      )}
      {error ? (
        <span className="text-red-800" role="alert">
          {error}
        </span>
      ) : null}
    </div>
  );
}
