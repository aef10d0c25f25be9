"use client";

// A manager releases a batch held over a statutory cure maximum. The reason is required: it is the
// corrective action taken under the HACCP plan, kept with the batch and in the audit log.
import { Loader2, ShieldCheck } from "lucide-react";
import { useId, useRef, useState, type FormEvent } from "react";
import { describedBy, FieldError, FieldHint, FormMessage } from "@/components/ui/field";
import { ApiError, newIdempotencyKey, releaseHold, type Batch } from "@/lib/queries/planning";

export function HoldReleaseForm({ batch, onReleased }: { batch: Batch; onReleased: (batch: Batch) => void }) {
  const id = useId().replace(/:/g, "");
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<string[]>();
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);
  const key = useRef<string | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (busy) return;
    setMessage(undefined);
    if (!reason.trim()) {
      setErrors(["Say what corrective action was taken: the hold is released only with a reason."]);
      return;
    }
    setErrors(undefined);
    setBusy(true);
    key.current ??= newIdempotencyKey();
    try {
      const next = await releaseHold(batch.id, reason.trim(), key.current);
      key.current = null;
      onReleased(next);
    } catch (e2) {
      if (!(e2 instanceof ApiError) || e2.status === 0) {
        setMessage(`Not released yet: ${e2 instanceof Error ? e2.message : "something went wrong."} Try again: it cannot happen twice.`);
        return;
      }
      key.current = null;
      if (e2.fields.reason) setErrors(e2.fields.reason);
      else setMessage(`Not released: ${e2.message}`);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="space-y-3 print:hidden" aria-label="Release the hold">
      <div>
        <label htmlFor={`${id}-reason`} className="field-label">Corrective action taken (reason for release)</label>
        <textarea
          id={`${id}-reason`}
          className="field-input min-h-[5rem] py-2"
          value={reason}
          maxLength={1000}
          required
          aria-required="true"
          onChange={(e) => {
            setReason(e.target.value);
            key.current = null;
          }}
          {...describedBy(`${id}-reason`, errors, true)}
        />
        <FieldHint id={`${id}-reason`}>Required. What was done under the HACCP plan, e.g. reworked into a larger batch to bring the cure within the limit, or destroyed. Kept with the batch and in the audit log.</FieldHint>
        <FieldError id={`${id}-reason`} errors={errors} />
      </div>
      {message ? <FormMessage tone="error">{message}</FormMessage> : null}
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? <Loader2 aria-hidden className="h-5 w-5 animate-spin" /> : <ShieldCheck aria-hidden className="h-5 w-5" />}
        Release the hold
      </button>
    </form>
  );
}
