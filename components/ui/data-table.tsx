// Table styling in one place: calm rules, tabular figures, numbers right-aligned. Server-safe.
import type { ReactNode, TdHTMLAttributes, ThHTMLAttributes } from "react";

export function DataTable({ caption, children, captionHidden = true }: { caption: string; children: ReactNode; captionHidden?: boolean }) {
  return (
    <div className="panel overflow-x-auto">
      <table className="w-full border-collapse text-left text-[15px]">
        <caption className={captionHidden ? "sr-only" : "px-4 pt-3 text-left text-sm font-semibold text-brine"}>{caption}</caption>
        {children}
      </table>
    </div>
  );
}

export function THead({ children }: { children: ReactNode }) {
  return (
    <thead className="border-b border-salt-edge bg-salt-deep/60 text-sm text-brine">
      <tr>{children}</tr>
    </thead>
  );
}

export function TBody({ children }: { children: ReactNode }) {
  return <tbody className="divide-y divide-salt-edge">{children}</tbody>;
}

type Align = { numeric?: boolean; action?: boolean };

export function Th({ numeric, action, className = "", children, ...rest }: ThHTMLAttributes<HTMLTableCellElement> & Align) {
  return (
    <th
      scope="col"
      className={`whitespace-nowrap px-4 py-2.5 font-semibold ${numeric || action ? "text-right" : "text-left"} ${className}`}
      {...rest}
    >
      {action && !children ? <span className="sr-only">Actions</span> : children}
    </th>
  );
}

export function Td({ numeric, action, className = "", children, ...rest }: TdHTMLAttributes<HTMLTableCellElement> & Align) {
  return (
    <td
      className={`px-4 py-2 align-middle ${numeric ? "num text-right tabular-nums" : ""} ${action ? "whitespace-nowrap text-right" : ""} ${className}`}
      {...rest}
    >
      {children}
    </td>
  );
}

/** The row's header cell (its name), so screen readers announce it with each cell. */
export function RowHeader({ children, className = "" }: { children: ReactNode; className?: string }) {
  return (
    <th scope="row" className={`px-4 py-2 text-left align-middle font-semibold ${className}`}>
      {children}
    </th>
  );
}
