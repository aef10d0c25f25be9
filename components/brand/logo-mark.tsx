// The mark: a hank of casing (a loose coil) with a lot tag on its tail. Drawn for this product.
export function LogoMark({ className = "h-8 w-8", title }: { className?: string; title?: string }) {
  return (
    <svg viewBox="0 0 40 40" className={className} role={title ? "img" : undefined} aria-hidden={title ? undefined : true} aria-label={title}>
      <path
        d="M19 22 a1.5 1.5 0 0 1 3 0 a3 3 0 0 1 -6 0 a4.5 4.5 0 0 1 9 0 a6 6 0 0 1 -12 0 a7.5 7.5 0 0 1 15 0 a9 9 0 0 1 -18 0 a10.5 10.5 0 0 1 18.6 -6.6 L33 10"
        fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round"
      />
      <g transform="rotate(45 34.5 6.5)">
        <rect x="31" y="2.5" width="7" height="9" rx="1.5" fill="#D9663B" />
        <circle cx="34.5" cy="5" r="1.1" fill="#2A2623" />
      </g>
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
