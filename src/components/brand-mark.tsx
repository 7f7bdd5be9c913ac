/** Grainline's mark: a single polished grain on a ruled line. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true">
      <rect x="2" y="2" width="44" height="44" rx="10" fill="#2f5d50" />
      <ellipse cx="24" cy="21" rx="9" ry="13" fill="#f6f3ea" transform="rotate(-18 24 21)" />
      <ellipse cx="22.5" cy="17" rx="3" ry="5" fill="#f4e3b8" transform="rotate(-18 22.5 17)" />
      <rect x="8" y="37" width="32" height="3" rx="1.5" fill="#d9a441" />
    </svg>
  );
}
