import { clockTime } from "~/components/offline-banner";
import { useConnection } from "~/offline/use-connection";

/**
 * Without signal a kept page cannot say the gear is fit now, only when it was last checked: "Last checked
 * current at 09:40; offline since 10:15". Renders `children` (the page's own fitness words) with signal.
 */
export function OfflineCurrency({ checkedAt, children }: { checkedAt: string; children?: React.ReactNode }) {
  const { online, offlineSince } = useConnection();
  if (online) return <>{children}</>;
  return (
    <p
      role="status"
      data-testid="offline-currency"
      className="mb-4 rounded border-2 border-ink bg-warn-soft px-3 py-3 text-base font-semibold text-ink"
    >
      Last checked current at {clockTime(checkedAt)}
      {offlineSince ? `; offline since ${clockTime(offlineSince)}` : "; offline now"}. The gear may have changed since:
      check it with the appointed person before lifting if you can.
    </p>
  );
}
