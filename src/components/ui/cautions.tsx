/** The three cautions every user must see where certificates are concerned (DESIGN.md). */
export const CAUTIONS = [
  'A calibration certificate is valid only after an authorised signatory of the laboratory has reviewed and approved it.',
  'The rules of the laboratory’s accreditation body and local regulations take precedence over any default or wording in this software.',
  'Emberline does not assess optical-radiation or thermal safety (hot sources, lamps, lasers); follow your own safety procedures.',
] as const;

export function Cautions({ headingLevel = 2 }: { headingLevel?: 2 | 3 }) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section aria-labelledby="cautions-heading" className="rounded-card border border-warn bg-warn-soft px-5 py-4">
      <Heading id="cautions-heading" className="text-base font-semibold text-warn">
        Please note
      </Heading>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-ink">
        {CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}
