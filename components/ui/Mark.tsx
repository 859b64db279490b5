/** The Fanbound mark: one gate driving a fan of three inputs. */
export function Mark({ className = "h-6 w-6" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2">
      <path d="M4 8h8a8 8 0 0 1 0 16H4z" />
      <circle cx="22.5" cy="16" r="2" />
      <path d="M24.5 16L30 8M24.5 16H30M24.5 16L30 24" strokeLinecap="round" />
    </svg>
  );
}
