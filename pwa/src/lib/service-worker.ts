import { useSyncExternalStore } from 'react';
import { registerSW } from 'virtual:pwa-register';

/**
 * Service worker state for the UI. The worker is built with registerType 'prompt': a new
 * version is installed in the background and waits; the user decides when to reload, so a
 * running sweep is never cut off by an update.
 */
export interface ServiceWorkerState {
  /** The shell is cached; the app will load without a network. */
  offlineReady: boolean;
  /** A newer version is installed and waiting for the user's go-ahead. */
  needRefresh: boolean;
  /** Registration failed (unsupported browser, insecure origin, …). */
  error: string | null;
}

let state: ServiceWorkerState = { offlineReady: false, needRefresh: false, error: null };
const listeners = new Set<() => void>();
let applyUpdate: ((reload?: boolean) => Promise<void>) | null = null;

function setState(patch: Partial<ServiceWorkerState>): void {
  state = { ...state, ...patch };
  for (const listener of listeners) listener();
}

/** Registers the generated service worker once; call from main.tsx. */
export function registerServiceWorker(): void {
  if (applyUpdate || !('serviceWorker' in navigator)) return;
  applyUpdate = registerSW({
    immediate: true,
    onOfflineReady: () => setState({ offlineReady: true }),
    onNeedRefresh: () => setState({ needRefresh: true }),
    onRegisterError: (error: unknown) =>
      setState({ error: error instanceof Error ? error.message : String(error) }),
  });
}

/** Activates the waiting worker and reloads the page. */
export async function reloadWithUpdate(): Promise<void> {
  await applyUpdate?.(true);
}

/** Hides the "ready offline" / "update available" notice without acting on it. */
export function dismissServiceWorkerNotice(): void {
  setState({ offlineReady: false, needRefresh: false });
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function subscribeController(listener: () => void): () => void {
  if (!('serviceWorker' in navigator)) return () => {};
  navigator.serviceWorker.addEventListener('controllerchange', listener);
  return () => navigator.serviceWorker.removeEventListener('controllerchange', listener);
}

function isControlled(): boolean {
  return 'serviceWorker' in navigator && navigator.serviceWorker.controller !== null;
}

/** True when this page is served by the service worker, i.e. the app opens offline. */
export function useServiceWorkerControlled(): boolean {
  return useSyncExternalStore(subscribeController, isControlled, () => false);
}

export function useServiceWorkerState(): ServiceWorkerState {
  return useSyncExternalStore(subscribe, () => state, () => state);
}
