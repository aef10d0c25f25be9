// The mark: a hank of casing (three loose coils) held by a lot tag. Drawn for this product.
export function LogoMark({ className = "h-8 w-8", title }: { className?: string; title?: string }) {
  return (
    <svg viewBox="0 0 40 40" className={className} role={title ? "img" : undefined} aria-hidden={title ? undefined : true} aria-label={title}>
      <g fill="none" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round">
        <ellipse cx="17" cy="21" rx="12.5" ry="11" />
        <ellipse cx="17" cy="21" rx="8.5" ry="7.2" />
        <ellipse cx="17" cy="21" rx="4.4" ry="3.6" />
        <path d="M27.5 14.5 L33 8.5" />
      </g>
      <rect x="30" y="3" width="8" height="8" rx="1.6" transform="rotate(45 34 7)" fill="#AE3F1A" />
      <circle cx="34" cy="7" r="1.3" fill="#FAF7F2" />
    </svg>
  );
}

export function Wordmark({ className = "" }: { className?: string }) {
  return (
    <span className={`font-display font-semibold tracking-tight ${className}`}>
      Hank <span className="text-paprika">&amp;</span> Lot
    </span>
  );
}
