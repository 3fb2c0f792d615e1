"use client";

import type { TaskDraftInput } from "@/lib/validations/tasks";

/**
 * SLOT for the sky-map area (issue 8): suggested follow-up tasks inside the planning form, one per site with
 * observable probability. Call `onAccept(draft)` to add a suggestion to the form, which the shifter may edit or
 * remove. Renders nothing until that area fills it in; keep the props stable.
 */
export function SuggestedTasksSlot(_props: { candidateId: string; onAccept: (draft: TaskDraftInput) => void }) {
  return null;
}
