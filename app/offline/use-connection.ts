import { useSyncExternalStore } from "react";
import { connectionServerSnapshot, connectionSnapshot, subscribeConnection } from "~/offline/connection";

/** Whether the phone has signal and since when it has not; the server renders "online". */
export function useConnection() {
  return useSyncExternalStore(subscribeConnection, connectionSnapshot, connectionServerSnapshot);
}
