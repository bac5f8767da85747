/** Our mark: two fruit canes rising from a trunk into a V, buds along them. */
export function Logo({ size = 32 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 48 48" aria-hidden="true">
      <rect width="48" height="48" rx="10" fill="#244a2a" />
      <path d="M24 40 V28 M24 28 L12 10 M24 28 L36 10" stroke="#f7f5ee" strokeWidth="4" strokeLinecap="round" fill="none" />
      {[
        [15.5, 15.2],
        [19, 20.5],
        [32.5, 15.2],
        [29, 20.5],
      ].map(([cx, cy]) => (
        <circle key={`${cx}-${cy}`} cx={cx} cy={cy} r="2.6" fill="#e0a33a" />
      ))}
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="flex items-center gap-2 text-xl font-extrabold tracking-tight text-rootstock">
      <Logo />
      Vineward
    </span>
  );
}
