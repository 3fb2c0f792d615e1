"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { toastRefusal } from "@/components/board/mutation-errors";
import { queryKeys } from "@/components/live/query-keys";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { apiFetch } from "@/lib/api-client";
import type { NoteView } from "@/lib/data/candidates";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { noteBodySchema, type NoteBody } from "@/lib/validations/candidates";

/** The candidate's notes thread; new notes from anyone arrive through the live stream. */
export function NotesThread({ candidateId, initialNotes, timeZone }: { candidateId: string; initialNotes: NoteView[]; timeZone: string }) {
  const queryClient = useQueryClient();
  const key = queryKeys.notes(candidateId);
  const { data: notes } = useQuery({ queryKey: key, queryFn: () => apiFetch<NoteView[]>(`/api/v1/candidates/${candidateId}/notes`), initialData: initialNotes });
  const { register, handleSubmit, reset, formState } = useForm<NoteBody>({ resolver: zodResolver(noteBodySchema), defaultValues: { body: "" } });
  const add = useMutation({
    mutationFn: (body: NoteBody) => apiFetch<NoteView>(`/api/v1/candidates/${candidateId}/notes`, { method: "POST", json: body }),
    onSuccess: (note) => {
      queryClient.setQueryData<NoteView[]>(key, (old) => (old?.some((n) => n.id === note.id) ? old : [...(old ?? []), note]));
      reset();
    },
    onError: (error) => toastRefusal(error, "Adding the note"),
  });
  return (
    <div className="space-y-3">
      {notes.length === 0 ? <p className="text-sm text-muted">No notes yet. Notes are shared with everyone on shift.</p> : null}
      <ol className="space-y-3">
        {notes.map((note) => (
          <li key={note.id} className="flex gap-2">
            <Avatar name={note.author.name} initials={note.author.initials} className="h-7 w-7" />
            <div className="min-w-0">
              <p className="text-xs text-muted">
                <span className="font-medium text-fg">{note.author.name}</span> ·{" "}
                <time dateTime={isoUtc(note.createdAt)} title={isoUtc(note.createdAt)}>
                  {formatInZone(note.createdAt, timeZone)}
                </time>
              </p>
              <p className="whitespace-pre-wrap break-words text-sm">{note.body}</p>
            </div>
          </li>
        ))}
      </ol>
      <form onSubmit={handleSubmit((body) => add.mutate(body))} className="space-y-2">
        <label htmlFor="note-body" className="sr-only">
          Add a note
        </label>
        <Textarea id="note-body" placeholder="Add a note for the shift…" aria-invalid={Boolean(formState.errors.body)} {...register("body")} />
        {formState.errors.body ? <p role="alert" className="text-xs text-alarm">{formState.errors.body.message}</p> : null}
        <Button type="submit" size="sm" variant="primary" disabled={add.isPending}>
          Add note
        </Button>
      </form>
    </div>
  );
}
