// Labelled inputs with their hint and error wired up for assistive technology. Server-safe: no
// hooks, so client forms and server pages can both use these.
import { AlertCircle, CheckCircle2 } from "lucide-react";
import type { InputHTMLAttributes, ReactNode } from "react";

/** The aria props that tie an input to its hint and error. */
export function describedBy(id: string, errors?: string[], hint?: boolean) {
  const ids = [hint ? `${id}-hint` : null, errors?.length ? `${id}-error` : null].filter(Boolean).join(" ");
  return { "aria-invalid": errors?.length ? true : undefined, "aria-describedby": ids || undefined } as const;
}

export function FieldHint({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p id={`${id}-hint`} className="mt-1 text-sm text-brine">
      {children}
    </p>
  );
}

/** The first error of a field, announced when it appears. */
export function FieldError({ id, errors }: { id: string; errors?: string[] }) {
  if (!errors?.length) return null;
  return (
    <p id={`${id}-error`} role="alert" className="field-error flex items-start gap-1">
      <AlertCircle aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
      <span>{errors[0]}</span>
    </p>
  );
}

type InputProps = Omit<InputHTMLAttributes<HTMLInputElement>, "id" | "name" | "defaultValue"> & {
  name: string;
  label: string;
  id?: string;
  defaultValue?: string;
  errors?: string[];
  hint?: ReactNode;
  /** Focused first when the surrounding sheet opens. */
  initialFocus?: boolean;
};

export function TextField({ name, label, id = name, errors, hint, initialFocus, className, ...rest }: InputProps) {
  return (
    <div className={className}>
      <label htmlFor={id} className="field-label">{label}</label>
      <input
        id={id}
        name={name}
        type="text"
        className="field-input"
        data-autofocus={initialFocus ? "" : undefined}
        {...describedBy(id, errors, Boolean(hint))}
        {...rest}
      />
      {hint ? <FieldHint id={id}>{hint}</FieldHint> : null}
      <FieldError id={id} errors={errors} />
    </div>
  );
}

/** One sentence about the whole form: errors are alerts, success is a polite status. */
export function FormMessage({ tone, children }: { tone: "error" | "success"; children?: ReactNode }) {
  if (!children) return null;
  if (tone === "error") {
    return (
      <p role="alert" className="flex items-start gap-2 rounded-md border border-ember/30 bg-ember-soft px-3 py-2 text-sm font-medium text-ember">
        <AlertCircle aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
        <span>{children}</span>
      </p>
    );
  }
  return (
    <p className="flex items-start gap-2 rounded-md border border-herb/30 bg-herb-soft px-3 py-2 text-sm font-medium text-herb">
      <CheckCircle2 aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
      <span>{children}</span>
    </p>
  );
}

/** A polite live region that is always in the page, so what appears in it is read out. */
export function StatusRegion({ children, className }: { children?: ReactNode; className?: string }) {
  return (
    <div role="status" className={className}>
      {children ? <FormMessage tone="success">{children}</FormMessage> : null}
    </div>
  );
}

/** The "is this record in use" checkbox at the foot of an edit sheet (archived, active, still sold). */
export function StatusCheckbox({ id, name, label, defaultChecked, hint, errors }: {
  id: string;
  name: string;
  label: string;
  defaultChecked: boolean;
  hint: ReactNode;
  errors?: string[];
}) {
  return (
    <fieldset>
      <legend className="field-label">Status</legend>
      <label className="flex min-h-touch cursor-pointer items-start gap-3 rounded-md border border-brine-line px-3 py-2.5 hover:bg-salt">
        <input type="checkbox" name={name} defaultChecked={defaultChecked} className="mt-0.5 h-5 w-5 accent-paprika" {...describedBy(id, errors, true)} />
        <span>
          <span className="block font-semibold">{label}</span>
          <FieldHint id={id}>{hint}</FieldHint>
        </span>
      </label>
      <FieldError id={id} errors={errors} />
    </fieldset>
  );
}
