/** The Spoolwright mark: a bobbin with four turns of enamelled wire, and the name. */
export function Brand({ inverted = true }: { inverted?: boolean }) {
  return (
    <span className="flex items-center gap-2.5">
      <svg viewBox="0 0 32 32" className="size-8" aria-hidden>
        <rect width="32" height="32" rx="6" fill={inverted ? '#2e3236' : '#1f2225'} />
        <rect x="7" y="5" width="18" height="3" rx="1" fill="#8a929a" />
        <rect x="7" y="24" width="18" height="3" rx="1" fill="#8a929a" />
        <path d="M9 10.5h14M9 14h14M9 17.5h14M9 21h14" fill="none" stroke="#cf7d47" strokeWidth="2.2" strokeLinecap="round" />
      </svg>
      <span className={`text-xl font-bold tracking-tight ${inverted ? 'text-white' : 'text-graphite-950'}`}>Spoolwright</span>
    </span>
  );
}
