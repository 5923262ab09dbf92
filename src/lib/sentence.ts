/**
 * Free text (an amendment's reason) set into a sentence that adds its own full stop: without the
 * text's final stop and trailing space, so it never reads "..".
 */
export function withoutFinalStop(text: string): string {
  return text.trim().replace(/[.\s]+$/, '');
}
