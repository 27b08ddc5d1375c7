/** Work that reached the server from a phone without signal, as the plan page lists it. */
export type ArrivedFromPhone = {
  clientId: string;
  outcome: "pending" | "recorded" | "refused";
  message: string;
  madeAt: string;
  receivedAt: string;
  changes: Array<{ itemCode: string; kind: string; message: string }>;
};

const stamp = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

/**
 * Lift records sent from a phone: when each was made and when it arrived, what the server decided, and what
 * changed with the gear in between, so the planner sees what the rigger was told.
 */
export function ArrivedFromPhonePanel({ arrived }: { arrived: ArrivedFromPhone[] }) {
  if (!arrived.length) return null;
  return (
    <section className="mb-6 rounded border-2 border-steel/50 bg-white p-4" data-testid="arrived-from-phone">
      <h2 className="text-lg font-semibold">Lift records sent from a phone without signal</h2>
      <ul className="mt-2 space-y-3 text-sm">
        {arrived.map((a) => (
          <li key={a.clientId}>
            <p>
              <span className="font-semibold">{a.outcome === "refused" ? "Refused" : "Recorded"}</span>: made{" "}
              {stamp(a.madeAt)}, arrived {stamp(a.receivedAt)}. {a.message}
            </p>
            {a.changes.length > 0 && (
              <ul className="mt-1 list-disc pl-5 text-fail">
                {a.changes.map((c, i) => (
                  <li key={i}>Changed after it was made: {c.message}</li>
                ))}
              </ul>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
