import { Form } from "react-router";
import { formatDateTime } from "~/utils/dates";
import { Button } from "~/components/ui/form";

export type SessionListRow = {
  id: number;
  createdAt: string;
  lastSeenAt: string;
  address: string | null;
  userAgent: string | null;
};

const when = (iso: string) => formatDateTime(iso, "UTC");

/** A short name for a browser from its user agent, for a person to recognise, not to decide anything by. */
function browserName(userAgent: string | null) {
  if (!userAgent) return "Unknown browser";
  const browser = (
    [
      [/Edg\//, "Edge"],
      [/Firefox\//, "Firefox"],
      [/Chrome\//, "Chrome"],
      [/Safari\//, "Safari"],
    ] as const
  ).find(([pattern]) => pattern.test(userAgent))?.[1];
  const system = (
    [
      [/Windows/, "Windows"],
      [/Android/, "Android"],
      [/iPhone|iPad/, "iOS"],
      [/Mac OS X/, "macOS"],
      [/Linux/, "Linux"],
    ] as const
  ).find(([pattern]) => pattern.test(userAgent))?.[1];
  if (!browser && !system) return userAgent.slice(0, 60);
  return [browser ?? "A browser", system && `on ${system}`].filter(Boolean).join(" ");
}

/** The signed-in user's live sessions, each with a button to end it; this browser's is marked and kept. */
export function SessionList({ sessions, currentSessionId }: { sessions: SessionListRow[]; currentSessionId: number }) {
  const others = sessions.filter((s) => s.id !== currentSessionId);
  return (
    <div className="space-y-3 text-sm">
      <p className="text-ink-soft">
        Each browser you signed in with. End any you do not recognise, then change your password.
      </p>
      <div className="overflow-x-auto">
        <table>
          <caption className="sr-only">Your signed-in sessions</caption>
          <thead>
            <tr>
              <th scope="col">Browser</th>
              <th scope="col">Address</th>
              <th scope="col">Signed in</th>
              <th scope="col">Last used</th>
              <th scope="col">
                <span className="sr-only">End</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {sessions.map((s) => (
              <tr key={s.id}>
                <td title={s.userAgent ?? undefined}>{browserName(s.userAgent)}</td>
                <td>{s.address ?? "not known"}</td>
                <td className="whitespace-nowrap">{when(s.createdAt)}</td>
                <td className="whitespace-nowrap">{when(s.lastSeenAt)}</td>
                <td>
                  {s.id === currentSessionId ? (
                    <span className="font-semibold">This browser</span>
                  ) : (
                    <Form method="post">
                      <input type="hidden" name="intent" value="end-session" />
                      <input type="hidden" name="sessionId" value={s.id} />
                      <Button
                        type="submit"
                        tone="secondary"
                        aria-label={`End the session signed in ${when(s.createdAt)}`}
                      >
                        End
                      </Button>
                    </Form>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {others.length > 0 && (
        <Form method="post">
          <input type="hidden" name="intent" value="end-other-sessions" />
          <Button type="submit" tone="danger">
            Sign out everywhere else
          </Button>
        </Form>
      )}
    </div>
  );
}
