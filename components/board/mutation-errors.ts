import { toast } from "sonner";
import { ApiClientError } from "@/lib/api-client";

/** A clear message for a refused change: who beat you to it (409), what your role allows (403), what is wrong (422). */
export function toastRefusal(error: unknown, what: string): void {
  if (!(error instanceof ApiClientError)) {
    toast.error(`${what} failed`, { description: "The server could not be reached. Your change was undone." });
    return;
  }
  const by = (error.body.by ?? error.body.claimedBy) as { name?: string } | null | undefined;
  if (error.status === 409) {
    toast.error(by?.name ? `${by.name} got there first` : "Someone else changed this first", {
      description: `${error.body.error}. The board shows the current state.`,
    });
  } else if (error.status === 403) {
    toast.error("Not allowed for your role", { description: error.body.error });
  } else {
    toast.error(`${what} refused`, { description: error.body.error });
  }
}
