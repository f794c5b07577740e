/** The Ledgerline mark (public/favicon.svg, drawn by scripts/icons.mjs): a ruled line with one moment marked. */
export function Mark({ size = 40, title }: { size?: number; title?: string }) {
  return (
    <svg viewBox="0 0 512 512" width={size} height={size} role={title ? 'img' : undefined} aria-hidden={title ? undefined : true} aria-label={title}>
      <rect x="16" y="16" width="480" height="480" rx="112" fill="#16324f" />
      <rect x="96" y="150" width="320" height="22" rx="11" fill="#f7f3ea" opacity="0.45" />
      <rect x="96" y="245" width="320" height="22" rx="11" fill="#f7f3ea" />
      <rect x="126" y="215" width="16" height="82" rx="8" fill="#f7f3ea" />
      <rect x="248" y="215" width="16" height="82" rx="8" fill="#f7f3ea" />
      <rect x="370" y="215" width="16" height="82" rx="8" fill="#f7f3ea" />
      <circle cx="318" cy="256" r="44" fill="#e0a526" stroke="#16324f" strokeWidth="14" />
      <rect x="96" y="340" width="200" height="22" rx="11" fill="#f7f3ea" opacity="0.45" />
    </svg>
  );
}
