import { redirect } from "react-router";
import type { Route } from "./+types/logout";
import { destroyUserSession } from "~/utils/session.server";

export async function loader() {
  // Signing out changes state, so it is a POST; a plain visit goes home.
  throw redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  return destroyUserSession(request);
}
