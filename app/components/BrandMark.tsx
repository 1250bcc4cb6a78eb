/** Kilostep's mark: three rising steps drawn as a single stroke, like a voltage stepped up. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" focusable="false" className={className}>
      <rect x="1" y="1" width="30" height="30" rx="5" fill="var(--color-accent)" />
      <path
        d="M6 24 H12 V18 H18 V12 H24 V7"
        fill="none"
        stroke="#fff"
        strokeWidth="2.6"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
      <circle cx="24" cy="7" r="2" fill="#fff" />
    </svg>
  );
}
