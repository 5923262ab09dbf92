/** Text kept on one line, such as a certificate or job number (it would otherwise break at a hyphen). */
export function NoBreak({ children }: { children: string }) {
  return <span className="whitespace-nowrap">{children}</span>;
}
