/** Wordmark: a phase curve bending through a crossover tick. */
export function Logo({ large = false }: { large?: boolean }) {
  const size = large ? 32 : 22;
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${large ? 'text-2xl' : 'text-base'}`}>
      <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
        <rect width="32" height="32" rx="7" fill="#4f46e5" />
        <path d="M4 9 C 12 9, 14 11, 17 16 S 22 23, 28 23" stroke="#fff" strokeWidth="2.4" fill="none" strokeLinecap="round" />
        <path d="M4 16 H28" stroke="#fbbf24" strokeWidth="1.4" strokeDasharray="2 2" />
        <circle cx="17" cy="16" r="2.4" fill="#fbbf24" />
      </svg>
      Phasewright
    </span>
  );
}
