import { Form, NavLink } from "react-router";
import { navItemsFor } from "~/components/navigation";
import { ROLE_LABELS, type Role } from "~/utils/roles";

type ShellUser = { name: string; organisationName: string; roles: Role[] };

function PlumbMark() {
  return (
    <svg aria-hidden="true" viewBox="0 0 24 24" className="h-7 w-7">
      <line x1="12" y1="1" x2="12" y2="9" stroke="currentColor" strokeWidth="1.6" />
      <path d="M12 9 L17 14 L12 23 L7 14 Z" fill="currentColor" />
    </svg>
  );
}

export function AppShell({
  user,
  flash,
  children,
}: {
  user: ShellUser | null;
  flash: string | null;
  children: React.ReactNode;
}) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="no-print border-b border-rule bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <a href="/" className="flex items-center gap-2 text-paper no-underline hover:no-underline">
            <span className="text-brass-soft">
              <PlumbMark />
            </span>
            <span className="text-xl font-semibold tracking-wide">Plumbline</span>
          </a>
          {user && (
            <nav aria-label="Main" className="order-3 w-full sm:order-none sm:w-auto">
              <ul className="flex flex-wrap gap-1">
                {navItemsFor(user.roles).map((item) => (
                  <li key={item.to}>
                    <NavLink
                      to={item.to}
                      end={item.to === "/"}
                      className={({ isActive }) =>
                        `block rounded px-3 py-1.5 text-sm font-medium no-underline hover:no-underline ${
                          isActive ? "bg-brass text-white" : "text-paper/90 hover:bg-white/10"
                        }`
                      }
                    >
                      {item.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </nav>
          )}
          {user && (
            <div className="ml-auto flex items-center gap-3 text-sm">
              <span className="hidden text-right leading-tight md:block">
                <span className="block font-medium">{user.name}</span>
                <span className="block text-xs text-paper/70">
                  {user.roles.map((r) => ROLE_LABELS[r]).join(", ")} · {user.organisationName}
                </span>
              </span>
              <NavLink to="/settings" className="text-paper/90">
                Settings
              </NavLink>
              <Form method="post" action="/logout">
                <button type="submit" className="rounded border border-paper/40 px-2 py-1 text-paper hover:bg-white/10">
                  Sign out
                </button>
              </Form>
            </div>
          )}
        </div>
      </header>
      {flash && (
        <div role="status" className="no-print border-b border-pass/30 bg-pass-soft">
          <p className="mx-auto max-w-6xl px-4 py-2 text-sm text-pass">{flash}</p>
        </div>
      )}
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">{children}</main>
      <footer className="no-print border-t border-rule py-3 text-center text-xs text-ink-soft">
        Plumbline supports, and does not replace, the judgement of the appointed person and your local lifting
        regulations.
        {user && (
          <>
            {" "}
            · <a href="/reference">Reference tables and their sources</a>
          </>
        )}
      </footer>
    </div>
  );
}
