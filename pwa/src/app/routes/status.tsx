import { HealthPanel } from '../../features/status/components/health-panel.js';

export function Component() {
  return (
    <>
      <title>Status · Phasewright</title>
      <HealthPanel />
    </>
  );
}
