/** Ebbline's mark: a discharge curve ebbing towards the zero line. */
export function Logo({ className = 'h-8 w-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect width="32" height="32" rx="7" fill="currentColor" className="text-tide-800" />
      <path d="M5 7 C 9 18, 15 24, 27 25" fill="none" stroke="#f2b544" strokeWidth="3" strokeLinecap="round" />
      <path d="M5 27 H27" stroke="#5fb3b3" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}
