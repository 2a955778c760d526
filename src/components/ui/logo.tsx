/** The product mark: an hourglass outline, for the wait after key-off. */
export function Logo({ className = 'h-7 w-7' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" className={`text-caution ${className}`}>
      <path d="M9 7h14l-5.5 9L23 25H9l5.5-9z" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinejoin="round" />
    </svg>
  );
}
