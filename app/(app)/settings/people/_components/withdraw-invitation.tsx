"use client";

import { useActionState, useEffect, useRef, useState } from "react";
import { useNotice } from "@/components/ui/notice";
import { withdrawInvitationAction, type WithdrawState } from "../actions";

/** Two steps, so a slip of the finger does not withdraw an invitation. */
export function WithdrawInvitation({ id, email }: { id: string; email: string }) {
  const setNotice = useNotice();
  // The notice is set here, not in an effect: on success this row stops being pending and the
  // component is gone in the same render.
  const [state, action, pending] = useActionState<WithdrawState, FormData>(async (prev, form) => {
    const next = await withdrawInvitationAction(prev, form);
    if (next.ok) setNotice(next.message);
    return next;
  }, {});
  const [asking, setAsking] = useState(false);
  const keepRef = useRef<HTMLButtonElement>(null);
  const startRef = useRef<HTMLButtonElement>(null);
  const wasAsking = useRef(false);

  useEffect(() => {
    if (asking) keepRef.current?.focus();
    else if (wasAsking.current) startRef.current?.focus();
    wasAsking.current = asking;
  }, [asking]);

  if (!asking) {
    return (
      <button ref={startRef} type="button" className="btn-quiet" onClick={() => setAsking(true)} aria-label={`Withdraw invitation to ${email}`}>
        Withdraw
      </button>
    );
  }
  return (
    <form action={action} className="flex items-center justify-end gap-2">
      <input type="hidden" name="id" value={id} />
      {state.message && !state.ok ? <span role="alert" className="whitespace-normal text-sm font-medium text-ember">{state.message}</span> : null}
      <button type="submit" className="btn border border-ember bg-white text-ember hover:bg-ember-soft" disabled={pending}>
        {pending ? "Withdrawing…" : "Yes, withdraw"}
      </button>
      <button ref={keepRef} type="button" className="btn-quiet" onClick={() => setAsking(false)}>Keep</button>
    </form>
  );
}
