/** The Emberline mark: a glowing source and the line of sight to it. */
export function Logo({ className, inverse = false }: { className?: string; inverse?: boolean }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className ?? ''}`}>
      <svg width="26" height="26" viewBox="0 0 26 26" aria-hidden="true" focusable="false">
        <circle cx="8" cy="13" r="5.5" fill="#c75a1f" />
        <circle cx="8" cy="13" r="2.5" fill="#f7c9a8" />
        <path d="M14 13h10" stroke={inverse ? '#dfe6ee' : '#1b2330'} strokeWidth="2" strokeLinecap="round" />
        <path d="M16 9.5h6M16 16.5h6" stroke={inverse ? '#a9b6c4' : '#4a5564'} strokeWidth="1.5" strokeLinecap="round" />
      </svg>
      <span className="text-lg font-semibold tracking-tight">Emberline</span>
    </span>
  );
}
