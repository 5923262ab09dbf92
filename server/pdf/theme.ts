/** Colours and type sizes of the certificate: dark ink on white, one warm accent for rules and headings. */
export const palette = {
  ink: '#1d232a',
  muted: '#5b6570',
  rule: '#c7ccd1',
  faint: '#eef0f2',
  accent: '#8c3b12',
  bar: '#b9c4cf',
} as const;

export const size = { title: 17, h2: 10, body: 8.6, small: 7.4, table: 7.6, tiny: 6.6 } as const;
