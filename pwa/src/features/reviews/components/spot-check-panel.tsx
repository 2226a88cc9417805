import { SPOT_CHECK_TOLERANCE, type MapPoint } from '@phasewright/physics-core';
import { useState } from 'react';
import { Badge } from '../../../components/ui/badge.js';
import { Button } from '../../../components/ui/button.js';
import { Card } from '../../../components/ui/card.js';
import { errorText } from '../../../lib/api-client.js';
import type { MapRecord, PointRow } from '../../../lib/db.js';
import { runtimeInfo } from '../../sweeps/api/sweeps.js';
import { sharedPool } from '../../sweeps/lib/run-manager.js';
import { useRunServerSpotCheck } from '../api/run-server-spot-check.js';
import type { ServerSpotCheckReport } from '../api/get-reviews.js';
import { runSpotCheck, type BrowserSpotCheckReport } from '../lib/spot-check.js';

const num = (x: number | undefined) => (x === undefined ? '—' : x.toExponential(3));

function ReportTable({ report, where }: { report: BrowserSpotCheckReport | ServerSpotCheckReport; where: 'browser' | 'server' }) {
  return (
    <div className="space-y-2" data-testid={`spot-check-report-${where}`} data-pass={String(report.pass)}>
      <p className="text-sm text-ink-800">
        <Badge tone={report.pass ? 'good' : 'bad'}>{report.pass ? 'pass' : 'fail'}</Badge> {report.sample} points
        {report.reproduced !== undefined ? ` · ${report.reproduced} reproduced` : ''}
        {report.storedLower ? ` · ${report.storedLower} stored lower` : ''}
        {report.differs ? ` · ${report.differs} differ` : ''} · {report.failed} not re-run · max |ΔE| {num(report.maxAbsEnergyDifference)} · max relative {num(report.maxRelEnergyDifference)} · labels agree {report.labelsAgree} of {report.labelsCompared}
      </p>
      <div className="overflow-x-auto">
        <table className="min-w-full text-left text-xs">
          <thead>
            <tr className="text-ink-600">
              <th className="pr-3">point</th>
              <th className="pr-3">stored E</th>
              <th className="pr-3">fresh E</th>
              <th className="pr-3">|ΔE|</th>
              <th className="pr-3">labels</th>
              <th className="pr-3">outcome</th>
              <th>why</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {report.points.map((p) => (
              <tr key={p.key}>
                <td className="pr-3">{p.key}</td>
                <td className="pr-3">{p.storedEnergy.toPrecision(12)}</td>
                <td className="pr-3">{p.freshEnergy?.toPrecision(12) ?? '—'}</td>
                <td className="pr-3">{num(p.absEnergyDifference)}</td>
                <td className="pr-3">
                  {p.storedLabel ?? '—'} / {p.freshLabel ?? '—'}
                </td>
                <td className="pr-3" data-outcome={p.outcome}>
                  {p.outcome ?? '—'}
                </td>
                <td className="font-sans">{p.problem ?? p.note ?? ('failed' in p ? p.failed : '')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** Re-runs K sampled points here (the page's worker pool) or on the server, and shows the agreement. */
export function SpotCheckPanel({ map, rows, projectId, reviewId, canAskServer, serverReports }: { map: MapRecord; rows: PointRow[]; projectId: string; reviewId?: string; canAskServer: boolean; serverReports: ServerSpotCheckReport[] }) {
  const [sample, setSample] = useState(4);
  const [seed, setSeed] = useState(1);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string>();
  const [report, setReport] = useState<BrowserSpotCheckReport>();
  const server = useRunServerSpotCheck(projectId, map.id);

  const runHere = async () => {
    setBusy(true);
    setError(undefined);
    try {
      const byKey: Record<string, MapPoint> = {};
      for (const r of rows) byKey[r.key] = r.point;
      setReport(await runSpotCheck(sharedPool(), map.sweep, byKey, { sample, seed, runtime: runtimeInfo() }));
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };
  const latestServer = server.data ?? serverReports.at(-1);
  return (
    <Card title="Spot-check" data={{ testid: 'spot-check' }}>
      <p className="mb-3 text-sm text-ink-700">
        Re-runs a random sample of points from scratch (no warm start) and compares energies and phase labels with the stored ones. Pass rule (the same in the command line, this browser and the server): exact diagonalization — every energy within {SPOT_CHECK_TOLERANCE.ed.toExponential(0)} of |ΔE|/max(|E|, 1) and every label the same; mean-field — within {SPOT_CHECK_TOLERANCE.meanfield.toExponential(0)} and the same label, and a re-run that finds a <i>lower</i> minimum fails (the map missed it there). A mean-field re-run that stops in a higher minimum passes with a note: the stored point had the sweep&apos;s warm start as one more candidate and is the lower variational energy.{' '}
        <b>A spot-check shows that the numbers are reproducible, not that they are correct</b>: the same finite cluster and the same approximations give the same answer.
      </p>
      <div className="mb-3 flex flex-wrap items-end gap-3 text-sm">
        <label className="flex flex-col">
          Points (K)
          <input className="w-20 rounded border border-line px-2 py-1" type="number" min={1} max={50} value={sample} onChange={(e) => setSample(Math.max(1, Number(e.target.value) || 1))} data-testid="spot-check-sample" />
        </label>
        <label className="flex flex-col">
          Seed
          <input className="w-24 rounded border border-line px-2 py-1" type="number" min={0} value={seed} onChange={(e) => setSeed(Math.max(0, Math.floor(Number(e.target.value) || 0)))} />
        </label>
        <Button onClick={() => void runHere()} disabled={busy || rows.length === 0} data-testid="spot-check-run">
          {busy ? 'Re-running…' : 'Re-run in this browser'}
        </Button>
        {canAskServer ? (
          <Button variant="secondary" onClick={() => server.mutate({ sample, seed, ...(reviewId ? { reviewId } : {}) })} disabled={server.isPending} data-testid="spot-check-server">
            {server.isPending ? 'Server is re-running…' : 'Ask the server'}
          </Button>
        ) : null}
      </div>
      {error ? <p className="text-sm text-red-800" role="alert">{error}</p> : null}
      {server.error ? <p className="text-sm text-red-800" role="alert">{errorText(server.error)}</p> : null}
      <div className="space-y-4">
        {report ? (
          <div>
            <h3 className="text-sm font-semibold">In this browser ({(report.wallMs / 1000).toFixed(1)} s)</h3>
            <ReportTable report={report} where="browser" />
          </div>
        ) : null}
        {latestServer ? (
          <div>
            <h3 className="text-sm font-semibold">On the server ({new Date(latestServer.createdAt).toLocaleString()}, tolerance {latestServer.tolerance})</h3>
            <ReportTable report={latestServer} where="server" />
          </div>
        ) : null}
      </div>
    </Card>
  );
}

