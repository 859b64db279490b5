"use client";
import { useState } from "react";
import useSWR from "swr";
import useSWRInfinite from "swr/infinite";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { ActivityItem, InvitationItem, MemberItem, Page, Role, WorkspaceInfo } from "@/lib/client/types";
import { ConfirmButton } from "@/components/ui/ConfirmButton";
import { fmtWhen } from "./format";

const ROLES: Array<[Role, string]> = [
  ["owner", "owner — manages members, families and settings"],
  ["designer", "designer — writes designs and saves revisions"],
  ["reviewer", "reviewer — reads, compares, comments, approves"],
  ["viewer", "viewer — reads"],
];
const RANK: Record<Role, number> = { owner: 0, designer: 1, reviewer: 2, viewer: 3 };

const field = "rounded border border-rule bg-paper px-2 py-1 text-sm";

/** The owner's page: members and their roles, invitations, and what changed in the workspace. */
export function MembersAdmin({ ws }: { ws: string }) {
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: me } = useSWR<{ user: { id: string } }>("/api/v1/me");
  const role = wsData?.workspace.role;
  const mayManage = role ? can(role, "member.manage") : false;
  const { data: members, error: membersError, mutate: mutateMembers } = useSWR<{ items: MemberItem[] }>(`/api/v1/workspaces/${ws}/members`);
  const { data: invitations, mutate: mutateInvitations } = useSWR<{ items: InvitationItem[] }>(
    mayManage ? `/api/v1/workspaces/${ws}/invitations` : null,
  );
  const activity = useSWRInfinite<Page<ActivityItem>>((i, prev: Page<ActivityItem> | null) =>
    i === 0 ? `/api/v1/workspaces/${ws}/activity?limit=25` : prev?.nextCursor ? `/api/v1/workspaces/${ws}/activity?limit=25&cursor=${prev.nextCursor}` : null,
  );
  const [notice, setNotice] = useState<{ kind: "ok" | "error"; text: string } | null>(null);

  const owners = members?.items.filter((m) => m.role === "owner").length ?? 0;

  async function act(fn: () => Promise<unknown>, ok: string) {
    setNotice(null);
    try {
      await fn();
      setNotice({ kind: "ok", text: ok });
    } catch (e) {
      setNotice({ kind: "error", text: e instanceof ApiError ? e.message : String(e) });
    }
    await Promise.all([mutateMembers(), mutateInvitations(), activity.mutate()]);
  }

  if (role && !mayManage) {
    return <p className="text-sm text-graphite">Members are managed by the workspace&apos;s owners; ask one of them to change a role or invite someone.</p>;
  }
  const pending = (invitations?.items ?? []).filter((i) => i.status === "open" || i.status === "expired");
  const entries = (activity.data ?? []).flatMap((p) => p.items);
  const more = activity.data?.[activity.data.length - 1]?.nextCursor;

  return (
    <div className="grid gap-8 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="space-y-8">
        <section aria-labelledby="members-h">
          <h1 id="members-h" className="mb-3 text-xl font-semibold">Members</h1>
          {notice && (
            <p role={notice.kind === "error" ? "alert" : "status"}
              className={`mb-3 rounded border px-3 py-2 text-sm ${notice.kind === "error" ? "border-vermilion/40 bg-vermilion/10 text-vermilion" : "border-accent/40 bg-accent/10 text-ink"}`}>
              {notice.text}
            </p>
          )}
          {membersError && <p role="alert" className="text-sm text-vermilion">{membersError.message}</p>}
          <div className="overflow-x-auto rounded border border-rule bg-sheet">
            <table className="w-full text-sm" data-testid="member-table">
              <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
                <tr>
                  <th className="px-3 py-2">Member</th>
                  <th className="px-3 py-2">Role</th>
                  <th className="px-3 py-2">Joined</th>
                  <th className="px-3 py-2" aria-label="Actions" />
                </tr>
              </thead>
              <tbody>
                {[...(members?.items ?? [])].sort((a, b) => RANK[a.role] - RANK[b.role] || a.name.localeCompare(b.name)).map((m) => {
                  const lastOwner = m.role === "owner" && owners <= 1;
                  const self = me?.user.id === m.userId;
                  return (
                    <tr key={m.userId} data-member={m.email} className="border-b border-rule/60 last:border-0">
                      <td className="px-3 py-2">
                        <div className="font-semibold">{m.name}{self && <span className="ml-2 text-xs font-normal text-graphite">(you)</span>}</div>
                        <div className="text-xs text-graphite">{m.email}</div>
                      </td>
                      <td className="px-3 py-2">
                        <RoleChange member={m} lastOwner={lastOwner}
                          onChange={(next) => act(
                            () => api(`/api/v1/workspaces/${ws}/members/${m.userId}`, { method: "PATCH", json: { role: next } }),
                            `${m.name} is now ${next}.`,
                          )} />
                      </td>
                      <td className="px-3 py-2 text-graphite">{fmtWhen(m.joinedAt)}</td>
                      <td className="px-3 py-2 text-right text-xs">
                        <ConfirmButton label="Remove" confirm="Yes, remove"
                          question={self ? "Leave this workspace? You lose access at once." : `Remove ${m.name} from the workspace?`}
                          disabled={lastOwner}
                          title={lastOwner ? "The last owner cannot be removed: make someone else owner first." : undefined}
                          onConfirm={() => act(() => api(`/api/v1/workspaces/${ws}/members/${m.userId}`, { method: "DELETE" }), `${m.name} was removed.`)} />
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {owners === 1 && (
            <p className="mt-2 text-xs text-graphite">
              A workspace keeps at least one owner: the last owner can be neither removed nor given another role. Make someone else owner first.
            </p>
          )}
        </section>

        <section aria-labelledby="invite-h">
          <h2 id="invite-h" className="mb-3 text-sm font-semibold uppercase tracking-wide text-graphite">Invite by e-mail</h2>
          <InviteForm ws={ws} onInvited={(email) => act(async () => undefined, `An invitation is on its way to ${email}. The link works once, for 7 days.`)} />
          <h3 className="mb-2 mt-5 text-sm font-semibold">Pending invitations</h3>
          {pending.length === 0 ? (
            <p className="text-sm text-graphite">No invitation is waiting for an answer.</p>
          ) : (
            <ul className="divide-y divide-rule/60 rounded border border-rule bg-sheet text-sm" data-testid="invitation-list">
              {pending.map((i) => (
                <li key={i.id} data-invitation={i.email} className="flex flex-wrap items-center gap-3 px-3 py-2">
                  <span className="font-semibold">{i.email}</span>
                  <span className="text-graphite">as {i.role}</span>
                  <span className={`text-xs ${i.status === "expired" ? "text-amber" : "text-graphite"}`}>
                    {i.status === "expired" ? "expired" : `open until ${i.expiresAt.slice(0, 10)}`} · invited by {i.invitedBy.name}
                  </span>
                  <span className="ml-auto flex items-center gap-3 text-xs">
                    <button type="button" className="text-graphite hover:text-ink"
                      onClick={() => act(() => api(`/api/v1/workspaces/${ws}/invitations/${i.id}/resend`, { method: "POST" }),
                        `The invitation to ${i.email} was sent again; the earlier link no longer works.`)}>
                      Send again
                    </button>
                    <ConfirmButton label="Cancel" confirm="Yes, cancel it" question={`Cancel the invitation to ${i.email}? Its link stops working.`}
                      onConfirm={() => act(() => api(`/api/v1/workspaces/${ws}/invitations/${i.id}`, { method: "DELETE" }), `The invitation to ${i.email} was cancelled.`)} />
                  </span>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>

      <section aria-labelledby="activity-h">
        <h2 id="activity-h" className="mb-3 text-sm font-semibold uppercase tracking-wide text-graphite">Activity</h2>
        <ol className="space-y-2 text-sm" data-testid="activity-list">
          {entries.map((e) => (
            <li key={e.id} data-action={e.action} className="rounded border border-rule/70 bg-sheet px-3 py-2">
              <div>
                <span className="font-semibold">{e.actor?.name ?? "Fanbound"}</span> {e.summary}
              </div>
              <time dateTime={e.at} title={e.at} className="text-xs text-graphite">{fmtWhen(e.at)}</time>
            </li>
          ))}
          {activity.data && entries.length === 0 && <li className="text-graphite">Nothing has changed yet.</li>}
        </ol>
        {more && (
          <button type="button" onClick={() => void activity.setSize(activity.size + 1)}
            className="mt-3 rounded border border-rule px-3 py-1 text-sm hover:border-ink">
            Earlier entries
          </button>
        )}
        <p className="mt-3 text-xs text-graphite">The list is kept as it happened: entries cannot be changed or removed.</p>
      </section>
    </div>
  );
}

/** The role of one member; lowering an owner asks first, and the last owner's role is fixed. */
function RoleChange({ member, lastOwner, onChange }: { member: MemberItem; lastOwner: boolean; onChange: (r: Role) => Promise<void> }) {
  const [asking, setAsking] = useState<Role | null>(null);
  if (asking) {
    return (
      <span role="group" aria-label={`Make ${member.name} ${asking}?`} className="inline-flex flex-wrap items-center gap-2 rounded border border-vermilion/40 bg-vermilion/5 px-2 py-1 text-xs">
        <span>{member.name} stops managing the workspace. Make them {asking}?</span>
        <button type="button" autoFocus className="rounded bg-vermilion px-2 py-0.5 font-semibold text-paper"
          onClick={async () => { const r = asking; setAsking(null); await onChange(r); }}>
          Yes, make {asking}
        </button>
        <button type="button" className="rounded border border-rule px-2 py-0.5" onClick={() => setAsking(null)}>Keep owner</button>
      </span>
    );
  }
  return (
    <select className={field} value={member.role} aria-label={`Role of ${member.name}`} disabled={lastOwner}
      title={lastOwner ? "The last owner keeps the owner role: make someone else owner first." : undefined}
      onChange={(e) => {
        const next = e.target.value as Role;
        if (member.role === "owner" && next !== "owner") setAsking(next);
        else void onChange(next);
      }}>
      {ROLES.map(([r]) => <option key={r} value={r}>{r}</option>)}
    </select>
  );
}

function InviteForm({ ws, onInvited }: { ws: string; onInvited: (email: string) => void }) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const email = String(f.get("email") ?? "").trim();
    setError(null);
    if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) {
      setError("Give an e-mail address such as lockkeeper@ferrow.example.");
      return;
    }
    setBusy(true);
    try {
      await api(`/api/v1/workspaces/${ws}/invitations`, { method: "POST", json: { email, role: f.get("role") } });
      form.reset();
      onInvited(email);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3 rounded border border-rule bg-sheet p-3" noValidate>
      <label className="flex min-w-[16rem] flex-1 flex-col gap-0.5 text-xs text-graphite">
        E-mail
        <input name="email" type="email" required placeholder="lockkeeper@ferrow.example" className={`${field} text-ink`} />
      </label>
      <label className="flex flex-col gap-0.5 text-xs text-graphite">
        Role
        <select name="role" defaultValue="designer" className={field}>
          {ROLES.map(([r, text]) => <option key={r} value={r}>{text}</option>)}
        </select>
      </label>
      <button type="submit" disabled={busy} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {busy ? "Sending…" : "Send invitation"}
      </button>
      {error && <p role="alert" className="w-full text-sm text-vermilion">{error}</p>}
    </form>
  );
}
