import type { Route } from "./+types/verify.$token";
import { LiftFitness } from "~/components/lift-fitness";
import { LoadOverrideNotice } from "~/components/load-override-mark";
import { OfflineCurrency } from "~/components/offline-currency";
import { sinceText } from "~/plans/live-state";
import { verifyRevision } from "~/plans/verify.server";
import { getUser } from "~/utils/session.server";

export const meta: Route.MetaFunction = () => [
  { title: "Check a printed lift plan · Plumbline" },
  { name: "robots", content: "noindex" },
];

/**
 * Open to anyone holding the printed plan: says whether that revision is still the current approved
 * one and, if it is, whether its gear is fit to lift now, naming any item that is not and since when.
 * The register's reasons (defect reports) are shown only to the organisation's own people.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const found = await verifyRevision(params.token);
  if (!found) return { found: null, canOpen: false };
  const user = await getUser(request);
  const canOpen = user?.organisationId === found.organisationId;
  return {
    found: {
      title: found.title,
      site: found.site,
      revision: found.revision,
      status: found.status,
      supersededByRevision: found.supersededByRevision,
      planId: found.planId,
      intact: found.intact,
      loadOverride: found.loadOverride,
      live: found.live
        ? {
            fit: found.live.fit,
            checkedAt: found.live.checkedAt,
            liftDate: found.live.liftDate,
            problems: found.live.problems.map((p) => ({ ...p, detail: canOpen ? p.detail : "" })),
          }
        : null,
    },
    canOpen,
    units: user?.units ?? "metric",
  };
}

const VERDICTS = {
  approved: {
    title: "Current approved revision",
    tone: "border-pass bg-pass-soft text-pass",
    say: "This is the current approved revision of the plan. Lift only as it says, after the pre-lift checks.",
  },
  superseded: {
    title: "Superseded: do not use this copy",
    tone: "border-fail bg-fail-soft text-fail",
    say: "A newer revision has been approved. Get the current plan before lifting.",
  },
  cancelled: {
    title: "Cancelled: do not use this copy",
    tone: "border-fail bg-fail-soft text-fail",
    say: "This plan has been cancelled. Do not lift to it.",
  },
  completed: {
    title: "Lift completed",
    tone: "border-steel bg-steel-soft text-steel",
    say: "This lift has been made and recorded. A new lift needs a new approved plan.",
  },
} as const;

const when = (iso: string) => sinceText(iso);

export default function Verify({ loaderData }: Route.ComponentProps) {
  const { found, canOpen, units } = loaderData;
  if (!found) {
    return (
      <section className="mx-auto max-w-lg py-8" role="alert">
        <h1>Not a Plumbline plan we know</h1>
        <p className="mt-2">
          This code does not match any approved lift plan. Do not use the printed copy: ask the appointed person for the
          current plan.
        </p>
      </section>
    );
  }
  const live = found.live;
  const verdict = VERDICTS[found.status as keyof typeof VERDICTS] ?? VERDICTS.cancelled;
  return (
    <section className="mx-auto max-w-lg py-8" data-testid="verify">
      {live && !live.fit && <LiftFitness live={live} />}
      <div className={`rounded border-2 p-4 ${verdict.tone}`} role="status">
        {live && !live.fit ? (
          <h2 className="text-xl">{verdict.title}</h2>
        ) : (
          <h1 className="text-2xl">{verdict.title}</h1>
        )}
        <p className="mt-2 text-ink">
          {live && !live.fit
            ? "This is still the current approved revision, but its gear is not fit to lift: see above."
            : verdict.say}
          {found.status === "superseded" && found.supersededByRevision
            ? ` It was replaced by revision ${found.supersededByRevision}.`
            : ""}
        </p>
        {live?.fit && (
          <OfflineCurrency checkedAt={live.checkedAt}>
            <p className="mt-2 text-ink" data-testid="fit">
              Fit to lift: every allocated item is in service, in date for thorough examination on {live.liftDate} and
              as approved. Checked {when(live.checkedAt)}.
            </p>
          </OfflineCurrency>
        )}
      </div>
      {!found.intact && (
        <p className="mt-4 rounded border-2 border-fail bg-fail-soft p-3 text-fail" role="alert">
          The stored record of this revision does not match its fingerprint. Do not use this copy: tell the appointed
          person.
        </p>
      )}
      <dl className="mt-4 space-y-1 text-sm">
        <div>
          <dt className="inline text-ink-soft">Plan: </dt>
          <dd className="inline font-semibold">{found.title}</dd>
        </div>
        <div>
          <dt className="inline text-ink-soft">Site: </dt>
          <dd className="inline">{found.site}</dd>
        </div>
        <div>
          <dt className="inline text-ink-soft">Revision on this copy: </dt>
          <dd className="inline">{found.revision}</dd>
        </div>
      </dl>
      <LoadOverrideNotice mark={found.loadOverride} units={units} />
      {canOpen && (
        <p className="mt-4">
          <a href={`/plans/${found.planId}`}>Open the plan</a>
        </p>
      )}
    </section>
  );
}
