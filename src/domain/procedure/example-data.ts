/**
 * The marker every demo or sample step carrying a number must show, so that invented values
 * are never taken for a maker's specification (see the product brief's safety section).
 */
export const EXAMPLE_DATA_NOTE = "Example data — not a maker's specification";

/** True when the text carries the example-data marker. */
export function isMarkedExample(text: string): boolean {
  return text.includes(EXAMPLE_DATA_NOTE);
}
