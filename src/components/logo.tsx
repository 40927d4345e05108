export function Logo({ className = 'size-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden>
      <rect width="32" height="32" rx="7" fill="#0e2a3b" />
      <path d="M4 19c4-5 8-5 12 0s8 5 12 0" fill="none" stroke="#5fd0c1" strokeWidth="3" strokeLinecap="round" />
      <circle cx="16" cy="10" r="3" fill="#f2c46d" />
    </svg>
  );
}
