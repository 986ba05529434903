/** The Denudata mark: a worn hillslope profile over a river line. */
export function BrandMark({ size = 22 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
      <rect width="32" height="32" rx="6" fill="var(--river)" />
      <path d="M4 23 C10 23 11 12 16 12 S22 19 28 19 V27 H4 Z" fill="var(--paper)" />
      <path d="M4 23 C10 23 11 12 16 12 S22 19 28 19" fill="none" stroke="var(--ochre)" strokeWidth="2" />
    </svg>
  );
}
