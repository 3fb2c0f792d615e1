"use client";

import { useRouter } from "next/navigation";
import { useEffect, useRef } from "react";
import { useLiveEvents } from "@/components/live/live-store";

/** Re-renders the candidate page (server data) when an event about this candidate arrives, at most once a second. */
export function CandidateLiveRefresh({ candidateId }: { candidateId: string }) {
  const router = useRouter();
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useEffect(() => () => clearTimeout(timer.current), []);
  useLiveEvents((event) => {
    if (event.candidateId !== candidateId || event.kind === "candidate.note-added") return;
    clearTimeout(timer.current);
    timer.current = setTimeout(() => router.refresh(), 1000);
  });
  return null;
}
