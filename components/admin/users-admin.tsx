"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/workflow/roles";

interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  status: "invited" | "active" | "deactivated";
  title: string;
  firm: string | null;
  version: number;
}

const STATUS_LABEL = { invited: "Invitation sent", active: "Active", deactivated: "Deactivated" } as const;

export function UsersAdmin({ selfId, firms }: { selfId: number; firms: { id: number; name: string }[] }) {
  const qc = useQueryClient();
  const users = useQuery({ queryKey: ["users"], queryFn: () => fetchJson<{ users: UserRow[] }>("/api/users").then((r) => r.users) });
  const [notice, setNotice] = useState<{ kind: "ok" | "error"; text: string } | null>(null);

  const update = useMutation({
    mutationFn: (v: { id: number; version: number; role?: Role; status?: "active" | "deactivated" }) =>
      fetchJson(`/api/users/${v.id}`, { method: "PATCH", json: { version: v.version, role: v.role, status: v.status } }),
    onSuccess: () => {
      setNotice({ kind: "ok", text: "Saved. That person's open sessions have ended." });
      void qc.invalidateQueries({ queryKey: ["users"] });
    },
    onError: (e) => setNotice({ kind: "error", text: e.message }),
  });

  const columns: ColumnDef<UserRow, unknown>[] = [
    { accessorKey: "name", header: "Name", cell: (c) => <span className="font-medium">{c.row.original.name}</span> },
    { accessorKey: "email", header: "E-mail", cell: (c) => <span className="num text-xs">{c.row.original.email}</span> },
    {
      accessorKey: "role",
      header: "Role",
      cell: (c) => {
        const u = c.row.original;
        if (u.id === selfId) return ROLE_LABELS[u.role];
        return (
          <select
            aria-label={`Role of ${u.name}`}
            value={u.role}
            disabled={update.isPending}
            onChange={(e) => update.mutate({ id: u.id, version: u.version, role: e.target.value as Role })}
            className="rounded-sm border border-rule-strong bg-sheet px-1.5 py-0.5 text-sm"
          >
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        );
      },
    },
    { accessorKey: "firm", header: "Firm", cell: (c) => c.row.original.firm ?? "—" },
    { accessorKey: "status", header: "Status", cell: (c) => STATUS_LABEL[c.row.original.status] },
    {
      id: "actions",
      header: "",
      enableSorting: false,
      cell: (c) => {
        const u = c.row.original;
        if (u.id === selfId || u.status === "invited") return null;
        const deactivate = u.status === "active";
        return (
          <Button
            variant={deactivate ? "danger" : "secondary"}
            disabled={update.isPending}
            onClick={() => update.mutate({ id: u.id, version: u.version, status: deactivate ? "deactivated" : "active" })}
            aria-label={`${deactivate ? "Deactivate" : "Reactivate"} ${u.name}`}
          >
            {deactivate ? "Deactivate" : "Reactivate"}
          </Button>
        );
      },
    },
  ];

  return (
    <div className="grid gap-8 lg:grid-cols-[1fr_20rem]">
      <section aria-labelledby="users-title" className="min-w-0">
        <h2 id="users-title" className="mb-3 text-lg font-semibold">
          People with access
        </h2>
        {notice ? <FormMessage kind={notice.kind}>{notice.text}</FormMessage> : null}
        {users.isError ? <FormMessage kind="error">{users.error.message}</FormMessage> : null}
        {users.isPending ? <p className="text-sm text-ink-soft">Loading…</p> : <DataTable data={users.data ?? []} columns={columns} filterLabel="Filter people" caption="Users" />}
      </section>
      <InviteForm firms={firms} onInvited={(email) => {
        setNotice({ kind: "ok", text: `Invitation sent to ${email}.` });
        void qc.invalidateQueries({ queryKey: ["users"] });
      }} />
    </div>
  );
}

function InviteForm({ firms, onInvited }: { firms: { id: number; name: string }[]; onInvited: (email: string) => void }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const invite = useMutation({
    mutationFn: (body: Record<string, unknown>) => fetchJson("/api/users", { method: "POST", json: body }),
  });

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const body = {
      name: f.get("name"),
      email: f.get("email"),
      role: f.get("role"),
      title: f.get("title") ?? "",
      ...(f.get("firmId") ? { firmId: Number(f.get("firmId")) } : {}),
    };
    setErrors({});
    setMessage(null);
    try {
      await invite.mutateAsync(body);
      form.reset();
      onInvited(String(body.email));
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields ?? {});
        setMessage(err.message);
      } else setMessage("The invitation could not be sent.");
    }
  }

  return (
    <section aria-labelledby="invite-title" className="border-l border-rule pl-6">
      <h2 id="invite-title" className="mb-3 text-lg font-semibold">
        Invite someone
      </h2>
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      <form onSubmit={submit} noValidate>
        <TextField label="Name" name="name" required error={errors.name} />
        <TextField label="E-mail address" name="email" type="email" required error={errors.email} />
        <SelectField label="Role" name="role" defaultValue="applicant" error={errors.role}>
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </SelectField>
        <TextField label="Job title (optional)" name="title" error={errors.title} />
        <SelectField label="Firm (applicants)" name="firmId" defaultValue="">
          <option value="">— none —</option>
          {firms.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name}
            </option>
          ))}
        </SelectField>
        <Button type="submit" disabled={invite.isPending}>
          {invite.isPending ? "Sending…" : "Send invitation"}
        </Button>
      </form>
    </section>
  );
}
