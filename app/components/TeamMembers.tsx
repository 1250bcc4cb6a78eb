import { Form } from "react-router";
import { formatDate } from "#app/lib/format.ts";

export interface MemberRow {
  userId: number;
  name: string;
  email: string;
  role: "owner" | "editor" | "viewer";
  joinedAt: string;
}

const ROLE_CHOICES = ["owner", "editor", "viewer"] as const;

/** The members table; owners get role and remove controls, except on the team's last owner. */
export function TeamMembers({
  members,
  me,
  canManage,
  ownerCount,
}: {
  members: MemberRow[];
  me: number;
  canManage: boolean;
  ownerCount: number;
}) {
  return (
    <section aria-labelledby="members-title" className="relative panel overflow-x-auto" tabIndex={0}>
      <h2 id="members-title" className="px-4 pt-4 text-lg">
        Members
      </h2>
      <table className="data-table mt-2">
        <thead>
          <tr>
            <th scope="col">Name</th>
            <th scope="col">E-mail</th>
            <th scope="col">Role</th>
            <th scope="col">Joined</th>
            {canManage ? (
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            ) : null}
          </tr>
        </thead>
        <tbody>
          {members.map((m) => {
            const isLastOwner = m.role === "owner" && ownerCount === 1;
            const selectId = `role-${m.userId}`;
            return (
              <tr key={m.userId}>
                <td className="font-medium">
                  {m.name}
                  {m.userId === me ? <span className="text-ink-muted"> (you)</span> : null}
                </td>
                <td className="text-ink-soft">{m.email}</td>
                <td>
                  {canManage && !isLastOwner ? (
                    <Form method="post" className="flex items-center gap-2" key={`${m.userId}-${m.role}`}>
                      <input type="hidden" name="intent" value="change-role" />
                      <input type="hidden" name="userId" value={m.userId} />
                      <label htmlFor={selectId} className="sr-only">
                        Role of {m.name}
                      </label>
                      <select id={selectId} name="role" defaultValue={m.role} className="input min-h-8 w-28 py-1">
                        {ROLE_CHOICES.map((r) => (
                          <option key={r} value={r}>
                            {r}
                          </option>
                        ))}
                      </select>
                      <button type="submit" className="btn btn-small" aria-label={`Save role of ${m.name}`}>
                        Save
                      </button>
                    </Form>
                  ) : (
                    <span className="role-badge">{m.role}</span>
                  )}
                  {canManage && isLastOwner ? <span className="block text-sm text-ink-muted">the last owner</span> : null}
                </td>
                <td className="whitespace-nowrap">{formatDate(m.joinedAt)}</td>
                {canManage ? (
                  <td className="text-right">
                    {!isLastOwner && m.userId !== me ? (
                      <Form method="post">
                        <input type="hidden" name="intent" value="remove" />
                        <input type="hidden" name="userId" value={m.userId} />
                        <button type="submit" className="btn btn-small btn-danger" aria-label={`Remove ${m.name} from the team`}>
                          Remove
                        </button>
                      </Form>
                    ) : null}
                  </td>
                ) : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </section>
  );
}
