/**
 * SLOT for the sky-map area (issue 8): the candidate page renders this where the sky-map panel belongs.
 * It renders nothing until that area fills it in; keep the props stable.
 */
export function SkymapSlot(_props: { candidateId: string; revision: number; timeZone: string }) {
  return null;
}
