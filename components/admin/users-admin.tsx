"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import {
  createColumnHelper,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { UserPlus } from "lucide-react";
import { useMemo, useState } from "react";
import { toast } from "sonner";
import { DataTable } from "@/components/ui/data-table";
import { Avatar } from "@/components/ui/avatar";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Select } from "@/components/ui/field";
import { roles, type Role } from "@/db/schema/roles";
import { apiFetch, errorText } from "@/lib/api-client";
import { roleLabels, type SessionUser } from "@/lib/auth/roles";
import type { PublicUser } from "@/lib/data/users";
import type { CreateUserInput, UpdateUserInput } from "@/lib/validations/users";
import { CreateUserForm } from "./user-form";

type Row = Omit<PublicUser, "createdAt" | "disabledAt"> & { createdAt: string; disabledAt: string | null };
const column = createColumnHelper<Row>();

export function UsersAdmin({ actor }: { actor: SessionUser }) {
  const queryClient = useQueryClient();
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [creating, setCreating] = useState(false);
  const allowedRoles: readonly Role[] = actor.role === "admin" ? roles : roles.filter((r) => r !== "admin");

  const query = useQuery({ queryKey: ["users"], queryFn: () => apiFetch<{ users: Row[] }>("/api/v1/users") });
  const create = useMutation({
    mutationFn: (values: CreateUserInput) => apiFetch("/api/v1/users", { method: "POST", json: values }),
    onSuccess: () => {
      toast.success("Person added");
      setCreating(false);
      void queryClient.invalidateQueries({ queryKey: ["users"] });
    },
    onError: (e) => toast.error(errorText(e)),
  });
  const update = useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: UpdateUserInput }) => apiFetch(`/api/v1/users/${id}`, { method: "PATCH", json: patch }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: ["users"] }),
    onError: (e) => toast.error(errorText(e)),
  });

  const columns = useMemo(
    () => [
      column.accessor("name", {
        header: "Name",
        cell: (c) => (
          <span className="flex items-center gap-2">
            <Avatar name={c.getValue()} initials={c.row.original.initials} />
            {c.getValue()}
          </span>
        ),
      }),
      column.accessor("email", { header: "E-mail", cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
      column.accessor("role", {
        header: "Role",
        cell: (c) => {
          const target = c.row.original;
          const locked = target.id === actor.id || (actor.role !== "admin" && target.role === "admin");
          return (
            <Select
              aria-label={`Role of ${target.name}`}
              className="h-8 w-40 py-0"
              value={c.getValue()}
              disabled={locked || update.isPending}
              onChange={(e) => update.mutate({ id: target.id, patch: { role: e.target.value as Role } })}
            >
              {roles
                .filter((r) => allowedRoles.includes(r) || r === target.role)
                .map((r) => (
                  <option key={r} value={r}>
                    {roleLabels[r]}
                  </option>
                ))}
            </Select>
          );
        },
      }),
      column.accessor("timeZone", { header: "Time zone" }),
      column.accessor("disabledAt", {
        header: "Status",
        cell: (c) => (c.getValue() ? <Badge tone="alarm">Disabled</Badge> : <Badge tone="ok">Active</Badge>),
      }),
      column.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const target = c.row.original;
          if (target.id === actor.id) return <span className="text-xs text-faint">you</span>;
          if (actor.role !== "admin" && target.role === "admin") return <span className="text-xs text-faint">administrators only</span>;
          const disabled = !!target.disabledAt;
          return (
            <Button size="sm" variant={disabled ? "secondary" : "danger"} onClick={() => update.mutate({ id: target.id, patch: { disabled: !disabled } })}>
              {disabled ? "Enable" : "Disable"}
            </Button>
          );
        },
      }),
    ],
    [actor.id, actor.role, allowedRoles, update],
  );

  const table = useReactTable({
    data: query.data?.users ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="space-y-3">
      <div className="flex justify-end">
        <Button variant="primary" onClick={() => setCreating(true)}>
          <UserPlus className="h-4 w-4" aria-hidden /> Add person
        </Button>
      </div>
      <div className="relative overflow-x-auto rounded-lg border border-line bg-surface">
        <DataTable table={table} caption="People and their roles" />
        {query.isLoading ? <p className="p-4 text-sm text-muted">Loading people…</p> : null}
        {query.isError ? <p className="p-4 text-sm text-alarm">Could not load people: {errorText(query.error)}</p> : null}
      </div>
      <Dialog open={creating} onOpenChange={setCreating} title="Add a person" description="They sign in with this e-mail and first password.">
        <CreateUserForm allowedRoles={allowedRoles} onSubmit={(v) => create.mutate(v)} pending={create.isPending} />
      </Dialog>
    </div>
  );
}
