import { Description, Dialog, DialogPanel, DialogTitle } from '@headlessui/react';
import type { ReactNode } from 'react';
import { Button } from './button.js';

interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  busy?: boolean;
  /** Shown under the text when the action failed (nothing was changed). */
  error?: string;
  onConfirm: () => void;
  onClose: () => void;
}

/** Headless UI's Dialog asking to confirm one action (focus trapped, Escape and the backdrop close it). */
export function ConfirmDialog({ open, title, children, confirmLabel, busy = false, error, onConfirm, onClose }: ConfirmDialogProps) {
  return (
    <Dialog open={open} onClose={busy ? () => {} : onClose} className="relative z-50">
      <div className="fixed inset-0 bg-ink-950/40" aria-hidden="true" />
      <div className="fixed inset-0 flex items-center justify-center p-4">
        <DialogPanel className="w-full max-w-md space-y-3 rounded-lg bg-surface p-5 shadow-xl ring-1 ring-line" data-testid="confirm-dialog">
          <DialogTitle className="text-lg font-bold text-ink-900">{title}</DialogTitle>
          <Description as="div" className="space-y-2 text-sm text-ink-800">
            {children}
          </Description>
          {error ? (
            <p className="text-sm text-red-800" role="alert">
              {error}
            </p>
          ) : null}
          <div className="flex justify-end gap-2 pt-1">
            <Button variant="secondary" onClick={onClose} disabled={busy}>
              Keep it
            </Button>
            <Button onClick={onConfirm} disabled={busy} data-testid="confirm-dialog-confirm">
              {busy ? 'Working…' : confirmLabel}
            </Button>
          </div>
        </DialogPanel>
      </div>
    </Dialog>
  );
}
