"use client";
/**
 * The team's members and their roles. Owners change roles and remove members; anyone may leave.
 * The server refuses to leave a team without an owner (409), and that message is shown as is.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { getJson, sendJson } from "../../client/http";
import type { Role, TeamMemberRow as Member } from "../../client/api-types";

const ROLES: Role[] = ["viewer", "editor", "owner"];

/** Members list with role controls for owners and a "Leave team" button for everyone. */
export function MembersPanel(props: {
  teamId: string;
  myUserId: string;
  myRole: Role;
  initialMembers: Member[];
}) {
  const client = useQueryClient();
  const router = useRouter();
  const key = ["team", props.teamId];
  const team = useQuery({
    queryKey: key,
    queryFn: () =>
      getJson<{ team: { role: Role; members: Member[] } }>(`/api/teams/${props.teamId}`),
    initialData: { team: { role: props.myRole, members: props.initialMembers } },
    staleTime: 10_000,
  });
  const refresh = () => void client.invalidateQueries({ queryKey: key });
  const setRole = useMutation({
    mutationFn: (v: { userId: string; role: Role }) =>
      sendJson(
        `/api/teams/${props.teamId}/members/${encodeURIComponent(v.userId)}`,
        { role: v.role },
        "PATCH",
      ),
    onSettled: refresh,
  });
  const remove = useMutation({
    mutationFn: (userId: string) =>
      sendJson(
        `/api/teams/${props.teamId}/members/${userId === props.myUserId ? "me" : encodeURIComponent(userId)}`,
        undefined,
        "DELETE",
      ),
    onSuccess: (_r, userId) => {
      if (userId === props.myUserId) {
        router.push("/teams");
        router.refresh();
      } else refresh();
    },
  });
  const isOwner = team.data.team.role === "owner";
  const owners = team.data.team.members.filter((m) => m.role === "owner").length;
  const error = setRole.error ?? remove.error;
  return (
    <div className="stack">
      <table className="list" data-testid="member-list">
        <thead>
          <tr>
            <th>Name</th>
            <th>Role</th>
            <th />
          </tr>
        </thead>
        <tbody>
          {team.data.team.members.map((m) => {
            const me = m.userId === props.myUserId;
            return (
              <tr key={m.userId}>
                <td>
                  {m.name} {me && <span className="muted">(you)</span>}
                  <div className="muted small">{m.email}</div>
                </td>
                <td>
                  {isOwner ? (
                    <select
                      aria-label={`Role of ${m.name}`}
                      value={m.role}
                      disabled={setRole.isPending}
                      onChange={(e) =>
                        setRole.mutate({ userId: m.userId, role: e.target.value as Role })
                      }
                    >
                      {ROLES.map((r) => (
                        <option key={r} value={r}>
                          {r}
                        </option>
                      ))}
                    </select>
                  ) : (
                    <span className={`role role-${m.role}`}>{m.role}</span>
                  )}
                </td>
                <td>
                  {me && m.role === "owner" && owners === 1 ? (
                    <span className="muted small" title="Make someone else owner before you leave">
                      the only owner
                    </span>
                  ) : me ? (
                    <button
                      type="button"
                      className="small"
                      disabled={remove.isPending}
                      onClick={() => window.confirm("Leave this team?") && remove.mutate(m.userId)}
                    >
                      Leave team
                    </button>
                  ) : (
                    isOwner && (
                      <button
                        type="button"
                        className="danger small"
                        disabled={remove.isPending}
                        onClick={() =>
                          window.confirm(`Remove ${m.name} from the team?`) &&
                          remove.mutate(m.userId)
                        }
                      >
                        Remove
                      </button>
                    )
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {error && (
        <p className="error-text" role="alert">
          {error.message}
        </p>
      )}
      <p className="muted small">
        Viewers read and comment; editors also create and revise entries and upload photos; owners
        also invite and manage members.
      </p>
    </div>
  );
}
