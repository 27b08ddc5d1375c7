import type { Role } from "~/utils/roles";

export type NavItem = { to: string; label: string; roles: Role[] | "all" };

/** The main navigation; each item shows only to the roles that work there. */
export const NAV_ITEMS: NavItem[] = [
  { to: "/", label: "Dashboard", roles: "all" },
  { to: "/jobs", label: "Jobs", roles: "all" },
  { to: "/gear", label: "Gear", roles: "all" },
  { to: "/components", label: "Components", roles: "all" },
  { to: "/sites", label: "Sites", roles: ["admin", "planner"] },
  { to: "/admin", label: "Admin", roles: ["admin"] },
];

export function navItemsFor(roles: readonly Role[]) {
  return NAV_ITEMS.filter((item) => item.roles === "all" || item.roles.some((r) => roles.includes(r)));
}
