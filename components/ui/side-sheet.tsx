"use client";

// A panel that slides in from the right over a dimmed page, so the list behind it stays in view.
// Built on the native modal <dialog>: the page behind is inert, focus stays inside, Escape and a
// click on the dimmed page close it, and focus goes back to whatever opened it.
import { X } from "lucide-react";
import { useEffect, useId, useRef, useState, type ReactNode } from "react";

export function SideSheet({ open, onClose, title, description, children }: {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  /** Mounted only while open, so a form inside starts fresh each time. */
  children: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const pressedOnBackdrop = useRef(false);
  const [entered, setEntered] = useState(false);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      dialog.showModal();
      void dialog.offsetWidth; // lay out the off-screen position first, so the slide-in animates
      // The first field marked for it, else the dialog's own choice (the first focusable element).
      dialog.querySelector<HTMLElement>("[data-autofocus]")?.focus();
      const frame = requestAnimationFrame(() => setEntered(true));
      return () => cancelAnimationFrame(frame);
    }
    if (!open && dialog.open) {
      dialog.close();
    }
    if (!open) {
      setEntered(false);
      const target = returnFocus.current;
      returnFocus.current = null;
      if (target?.isConnected) target.focus();
    }
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      // Escape: keep React in charge of the open state.
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      // Closed by the browser anyway (e.g. a second Escape): tell the owner.
      onClose={() => {
        if (open) onClose();
      }}
      onMouseDown={(e) => {
        pressedOnBackdrop.current = e.target === e.currentTarget;
      }}
      onClick={(e) => {
        // Only a press and release both on the dim area: dragging out of a field must not close.
        if (pressedOnBackdrop.current && e.target === e.currentTarget) onClose();
        pressedOnBackdrop.current = false;
      }}
      className={`fixed inset-y-0 left-auto right-0 !m-0 h-full max-h-full overflow-hidden w-full max-w-[30rem] border-0 border-l border-salt-edge bg-white p-0 text-pepper shadow-2xl transition-transform duration-200 ease-out backdrop:bg-pepper/40 motion-reduce:transition-none ${
        entered ? "translate-x-0" : "translate-x-full"
      }`}
    >
      {open ? (
        <div className="flex h-full flex-col">
          <header className="flex items-start justify-between gap-4 border-b border-salt-edge px-6 py-4">
            <div className="min-w-0">
              <h2 id={titleId} className="text-xl font-semibold leading-snug">{title}</h2>
              {description ? <p id={descriptionId} className="mt-1 text-sm text-brine">{description}</p> : null}
            </div>
            <button type="button" onClick={onClose} className="btn-quiet -mr-2 min-w-touch shrink-0 px-0" aria-label="Close">
              <X aria-hidden className="h-5 w-5" />
            </button>
          </header>
          <div className="flex-1 overflow-y-auto overscroll-contain px-6 pt-5">{children}</div>
        </div>
      ) : null}
    </dialog>
  );
}

/** The sheet's action row, kept in view at the bottom while the fields scroll. */
export function SideSheetFooter({ children }: { children: ReactNode }) {
  return (
    <div className="sticky bottom-0 -mx-6 mt-2 flex flex-wrap items-center justify-end gap-2 border-t border-salt-edge bg-white px-6 py-4">
      {children}
    </div>
  );
}
