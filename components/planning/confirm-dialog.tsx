"use client";

// A confirmation for a destructive step (release a reservation, cancel a plan), on the native modal
// <dialog>: the page behind is inert, Escape closes it, focus starts on the safe choice and goes
// back to whatever opened it.
import { Loader2 } from "lucide-react";
import { useEffect, useId, useRef, type ReactNode } from "react";

export function ConfirmDialog({ open, title, children, confirmLabel, cancelLabel = "Keep it", busy, onConfirm, onClose }: {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  busy?: boolean;
  onConfirm: () => void;
  onClose: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const keep = useRef<HTMLButtonElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const titleId = useId();
  const bodyId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      dialog.showModal();
      keep.current?.focus();
    } else if (!open && dialog.open) {
      dialog.close();
      const target = returnFocus.current;
      returnFocus.current = null;
      if (target?.isConnected) target.focus();
    }
  }, [open]);

  return (
    <dialog
      ref={ref}
      role="alertdialog"
      aria-labelledby={titleId}
      aria-describedby={bodyId}
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onClose();
      }}
      className="m-auto w-full max-w-md rounded-lg border border-salt-edge bg-white p-0 text-pepper shadow-2xl backdrop:bg-pepper/40"
    >
      {open ? (
        <div className="space-y-4 px-6 py-5">
          <h2 id={titleId} className="text-xl font-semibold">{title}</h2>
          <div id={bodyId} className="space-y-2 text-pepper-soft">{children}</div>
          <div className="flex flex-wrap justify-end gap-2 pt-2">
            <button ref={keep} type="button" className="btn-quiet" onClick={onClose} disabled={busy}>{cancelLabel}</button>
            <button type="button" className="btn border border-ember bg-ember text-white hover:bg-ember/90" onClick={onConfirm} disabled={busy}>
              {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : null}
              {confirmLabel}
            </button>
          </div>
        </div>
      ) : null}
    </dialog>
  );
}
