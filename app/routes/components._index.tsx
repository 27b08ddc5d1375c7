import { Form } from "react-router";
import type { Route } from "./+types/components._index";
import { EmptyState, PageHeader } from "~/components/ui/form";
import { MASS_SOURCE_LABELS } from "~/loads/component-definition";
import { withoutControlCharacters } from "~/utils/forms";
import { COMPONENT_LIST_KEYS, listComponentsPage } from "~/models/component.server";
import { Pager } from "~/components/ui/pager";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { hasAnyRole } from "~/utils/roles";
import { requireUser } from "~/utils/session.server";
import { formatMass } from "~/utils/format";

export const meta: Route.MetaFunction = () => [{ title: "Components · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const url = new URL(request.url);
  const archived = url.searchParams.get("archived") === "1";
  const query = withoutControlCharacters(url.searchParams.get("q") ?? "")
    .trim()
    .slice(0, 100);
  const page = await listComponentsPage(user.organisationId, readPageRequest(url, COMPONENT_LIST_KEYS), {
    archived,
    query,
  });
  return {
    units: user.units,
    archived,
    query,
    canEdit: hasAnyRole(user, "planner", "admin"),
    components: page.rows,
    pages: pageLinks(url, page),
  };
}

export default function Components({ loaderData }: Route.ComponentProps) {
  const { components, pages, canEdit, units, archived, query } = loaderData;
  return (
    <>
      <PageHeader
        title={archived ? "Archived components" : "Components"}
        lead="Reusable load definitions: mass and CoG with their sources, outline and lift points."
      >
        {canEdit && !archived && (
          <a
            href="/components/new"
            className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
          >
            New component
          </a>
        )}
        <a href={archived ? "/components" : "/components?archived=1"} className="px-2 py-2 text-sm">
          {archived ? "Current components" : "Archived"}
        </a>
      </PageHeader>
      <Form method="get" className="mb-4 flex gap-2" role="search">
        {archived && <input type="hidden" name="archived" value="1" />}
        <label htmlFor="component-search" className="sr-only">
          Search components by name
        </label>
        <input
          id="component-search"
          name="q"
          defaultValue={query}
          placeholder="Search by name"
          className="w-64 rounded border border-rule px-3 py-1.5"
        />
        <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm">
          Search
        </button>
      </Form>
      {components.length === 0 && !pages.previous ? (
        <EmptyState title={query ? "Nothing matches" : archived ? "Nothing archived" : "No components yet"}>
          {canEdit && !archived && !query
            ? "Add the component you will lift: its mass, CoG and lift points."
            : "Try another search."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded border border-rule bg-card">
          <table>
            <thead>
              <tr>
                <th scope="col">Component</th>
                <th scope="col">Mass</th>
                <th scope="col">Mass from</th>
                <th scope="col">Contingency</th>
                <th scope="col">Lift points</th>
              </tr>
            </thead>
            <tbody>
              {components.map((c) => (
                <tr key={c.id}>
                  <td>
                    <a href={`/components/${c.id}`}>{c.name}</a>
                  </td>
                  <td className="whitespace-nowrap">{formatMass(c.massKg, units)}</td>
                  <td>{MASS_SOURCE_LABELS[c.massSource]}</td>
                  <td>{c.contingencyPct} %</td>
                  <td>{c.liftPoints}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Pager label="Pages of components" {...pages} />
    </>
  );
}
