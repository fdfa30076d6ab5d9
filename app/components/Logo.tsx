/** Heatbook's mark: points rising on a straight line over a baseline (our own drawing). */
export function Logo({ size = 22 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" aria-hidden="true" focusable="false">
      <rect x="1" y="1" width="22" height="22" rx="5" fill="#9a4519" />
      <path d="M5 17.5 L19 7" stroke="#fcfaf5" strokeWidth="1.6" strokeLinecap="round" />
      <circle cx="7.2" cy="15.6" r="1.7" fill="#fcfaf5" />
      <circle cx="11.6" cy="12.8" r="1.7" fill="#fcfaf5" />
      <circle cx="16.2" cy="9.2" r="1.7" fill="#fcfaf5" />
      <path d="M5 19.5 H19" stroke="#f3e2d3" strokeWidth="1" strokeLinecap="round" opacity="0.7" />
    </svg>
  );
}
