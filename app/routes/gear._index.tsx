import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { Form, Link, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/gear._index";
import { DueLabel, StatusLabel, formatWll } from "~/components/gear-labels";
import { Button, EmptyState, PageHeader } from "~/components/ui/form";
import { safeText, searchText } from "~/utils/forms";
import { DUE_SOON_DAYS, DUE_STATE_LABELS, DUE_STATES } from "~/gear/due";
import { getOrganisationToday } from "~/models/organisation.server";
import { GEAR_KIND_INFO, GEAR_KINDS, GEAR_STATUS_LABELS, GEAR_STATUSES, kindLabel, sizeSummary } from "~/gear/kinds";
import { gearPageKeys, searchGearItems } from "~/models/gear-item-reads.server";
import { countGearDue, GEAR_SORT_KEYS, type GearRow, type GearSortKey } from "~/models/gear-item.server";
import { listSites } from "~/models/site.server";
import { hasAnyRole } from "~/utils/roles";
import { Pager } from "~/components/ui/pager";
import { pageLinks, readPageRequest } from "~/utils/keyset.server";
import { requireUser } from "~/utils/session.server";

// Unknown or malformed parameters fall back to "no filter" rather than failing the page.
const searchSchema = z.object({
  q: searchText().pipe(safeText().trim().max(100)).catch(""),
  kind: z.enum(GEAR_KINDS).optional().catch(undefined),
  status: z.enum(GEAR_STATUSES).optional().catch(undefined),
  site: z
    .union([z.literal("none"), z.coerce.number().int().positive()])
    .optional()
    .catch(undefined),
  due: z.enum(DUE_STATES).optional().catch(undefined),
  sort: z.enum(GEAR_SORT_KEYS).catch("itemCode"),
  dir: z.enum(["asc", "desc"]).catch("asc"),
});

export const meta: Route.MetaFunction = () => [{ title: "Gear register · Plumbline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const url = new URL(request.url);
  const raw = Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ""));
  const search = searchSchema.parse(raw);
  const today = await getOrganisationToday(user.organisationId);
  const query = { ...search, q: search.q || undefined };
  const pageRequest = readPageRequest(url, gearPageKeys(search.sort));
  const [page, sites, due] = await Promise.all([
    searchGearItems(user.organisationId, query, today, pageRequest),
    listSites(user.organisationId),
    countGearDue(user.organisationId, today),
  ]);
  // A page link whose items have since gone (or a cursor of another sort) starts the list again.
  if (page.rows.length === 0 && pageRequest.cursor) {
    url.searchParams.delete("after");
    url.searchParams.delete("before");
    throw redirect(url.pathname + url.search);
  }
  return {
    rows: page.rows,
    pages: pageLinks(url, page),
    search,
    today,
    due,
    sites: sites.map((s) => ({ id: s.id, name: s.name })),
    canEdit: hasAnyRole(user, "admin"),
  };
}

type Search = Route.ComponentProps["loaderData"]["search"];

function searchHref(search: Search, change: Partial<Record<keyof Search, string | number | undefined>>) {
  const params = new URLSearchParams();
  const merged: Record<string, unknown> = { ...search, ...change };
  for (const [key, value] of Object.entries(merged)) {
    if (
      value === undefined ||
      value === "" ||
      (key === "sort" && value === "itemCode") ||
      (key === "dir" && value === "asc")
    )
      continue;
    params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `/gear?${qs}` : "/gear";
}

const column = createColumnHelper<GearRow>();

const columns = [
  column.accessor("itemCode", {
    header: "Item id",
    meta: { sortKey: "itemCode" },
    cell: (c) => (
      <>
        <Link to={`/gear/${c.row.original.id}`} className="font-semibold whitespace-nowrap">
          {c.getValue()}
        </Link>
        {/* On narrow screens the status and due columns are hidden; their words come here. */}
        <span className="mt-1 flex flex-col items-start gap-1 md:hidden">
          {c.row.original.status !== "in_service" && <StatusLabel status={c.row.original.status} />}
          <DueLabel state={c.row.original.dueState} status={c.row.original.status} />
        </span>
      </>
    ),
  }),
  column.accessor("kind", {
    header: "Kind and size",
    meta: { sortKey: "kind" },
    cell: (c) => (
      <>
        {kindLabel(c.getValue())}
        <span className="block text-xs text-ink-soft">{sizeSummary(c.row.original)}</span>
      </>
    ),
  }),
  column.accessor("description", { header: "Description", meta: { className: "hidden lg:table-cell" } }),
  column.accessor("wllKg", {
    header: "WLL (marked)",
    meta: { sortKey: "wllKg" },
    cell: (c) => (
      <span className="whitespace-nowrap">
        {formatWll(c.row.original.wllValue, c.row.original.wllUnit, c.getValue())}
      </span>
    ),
  }),
  column.accessor("siteName", {
    header: "Home site",
    meta: { sortKey: "site", className: "hidden md:table-cell" },
    cell: (c) => c.getValue() ?? "—",
  }),
  column.accessor("status", {
    header: "Status",
    meta: { sortKey: "status", className: "hidden md:table-cell" },
    cell: (c) => <StatusLabel status={c.getValue()} />,
  }),
  column.accessor("nextDueOn", {
    header: "Next examination",
    meta: { sortKey: "nextDueOn", className: "hidden md:table-cell" },
    cell: (c) => (
      <span className="flex flex-wrap items-center gap-1">
        <span className="whitespace-nowrap">{c.getValue() ?? "—"}</span>
        <DueLabel state={c.row.original.dueState} status={c.row.original.status} />
      </span>
    ),
  }),
];

type ColumnMeta = { sortKey?: GearSortKey; className?: string };

export default function GearRegister({ loaderData }: Route.ComponentProps) {
  const { rows, pages, search, sites, canEdit, due } = loaderData;
  const sorting: SortingState = [
    { id: search.sort === "site" ? "siteName" : search.sort, desc: search.dir === "desc" },
  ];
  // TanStack Table returns functions React's compiler cannot memoise; this app does not run the compiler.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    state: { sorting },
  });
  const filtered = !!(search.q || search.kind || search.status || search.site || search.due);
  return (
    <>
      <PageHeader
        title="Gear register"
        lead="Every item of lifting gear, its marked WLL, status and thorough examinations."
      >
        <a
          href="/gear/export.csv"
          className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline hover:no-underline"
        >
          Export CSV
        </a>
        {canEdit && (
          <>
            <a
              href="/gear/import"
              className="rounded border border-rule bg-white px-4 py-2 text-sm font-semibold text-ink no-underline hover:no-underline"
            >
              Import CSV
            </a>
            <a
              href="/gear/new"
              className="rounded bg-steel px-4 py-2 text-sm font-semibold text-white no-underline hover:no-underline"
            >
              Add an item
            </a>
          </>
        )}
      </PageHeader>

      {(due.overdue > 0 || due.dueSoon > 0) && (
        <p className="mb-4 flex flex-wrap gap-2 text-sm" aria-label="Examinations falling due">
          {due.overdue > 0 && (
            <Link
              to={searchHref(search, { due: "overdue" })}
              className="rounded border border-fail/50 bg-fail-soft px-2 py-1 font-bold text-fail no-underline"
            >
              ! {due.overdue} OVERDUE
            </Link>
          )}
          {due.dueSoon > 0 && (
            <Link
              to={searchHref(search, { due: "due_soon" })}
              className="rounded border border-warn/50 bg-warn-soft px-2 py-1 font-semibold text-warn no-underline"
            >
              ◷ {due.dueSoon} due within {DUE_SOON_DAYS} days
            </Link>
          )}
        </p>
      )}

      <Form
        key={JSON.stringify(search)}
        method="get"
        className="mb-4 grid gap-3 rounded border border-rule bg-card p-3 sm:grid-cols-2 lg:grid-cols-6"
        role="search"
        aria-label="Filter the register"
      >
        <label className="block text-sm font-medium lg:col-span-2">
          Search
          <input
            type="search"
            name="q"
            defaultValue={search.q}
            placeholder="Id, description, maker, serial"
            className="mt-1 block w-full rounded border border-rule bg-white px-3 py-2 text-base"
          />
        </label>
        <FilterSelect
          label="Kind"
          name="kind"
          value={search.kind}
          options={GEAR_KINDS.map((k) => [k, GEAR_KIND_INFO[k].label])}
        />
        <FilterSelect
          label="Status"
          name="status"
          value={search.status}
          options={GEAR_STATUSES.map((s) => [s, GEAR_STATUS_LABELS[s]])}
        />
        <FilterSelect
          label="Home site"
          name="site"
          value={search.site === undefined ? undefined : String(search.site)}
          options={[["none", "No home site"], ...sites.map((s): [string, string] => [String(s.id), s.name])]}
        />
        <FilterSelect
          label="Examination"
          name="due"
          value={search.due}
          options={DUE_STATES.map((d) => [d, DUE_STATE_LABELS[d]])}
        />
        {search.sort !== "itemCode" && <input type="hidden" name="sort" value={search.sort} />}
        {search.dir !== "asc" && <input type="hidden" name="dir" value={search.dir} />}
        <div className="flex items-end gap-2 lg:col-span-6">
          <Button type="submit">Filter</Button>
          {filtered && (
            <Link to="/gear" className="px-2 py-2 text-sm">
              Clear filters
            </Link>
          )}
        </div>
      </Form>

      {rows.length === 0 ? (
        <EmptyState title={filtered ? "No items match" : "The register is empty"}>
          {filtered
            ? "Change or clear the filters."
            : canEdit
              ? "Add items one by one or import a CSV."
              : "Admins add the organisation's gear here."}
        </EmptyState>
      ) : (
        <>
          <p className="mb-2 text-sm text-ink-soft" aria-live="polite">
            Showing {rows.length.toLocaleString("en-GB")} {rows.length === 1 ? "item" : "items"}
            {pages.previous || pages.next ? " on this page" : ""}
          </p>
          <div className="overflow-x-auto rounded border border-rule bg-card">
            <table>
              <thead>
                {table.getHeaderGroups().map((group) => (
                  <tr key={group.id}>
                    {group.headers.map((header) => {
                      const meta = (header.column.columnDef.meta ?? {}) as ColumnMeta;
                      const sorted = meta.sortKey && search.sort === meta.sortKey ? search.dir : null;
                      const label = flexRender(header.column.columnDef.header, header.getContext());
                      return (
                        <th
                          key={header.id}
                          scope="col"
                          className={meta.className}
                          aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                        >
                          {meta.sortKey ? (
                            <Link
                              to={searchHref(search, {
                                sort: meta.sortKey,
                                dir: sorted === "asc" ? "desc" : "asc",
                              })}
                              className="whitespace-nowrap text-ink-soft"
                            >
                              {label}
                              <span aria-hidden="true"> {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                            </Link>
                          ) : (
                            label
                          )}
                        </th>
                      );
                    })}
                  </tr>
                ))}
              </thead>
              <tbody>
                {table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className={row.original.dueState === "overdue" ? "bg-fail-soft/40" : undefined}>
                    {row.getVisibleCells().map((cell) => (
                      <td key={cell.id} className={((cell.column.columnDef.meta ?? {}) as ColumnMeta).className}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager label="Pages of the register" {...pages} />
        </>
      )}
    </>
  );
}

function FilterSelect({
  label,
  name,
  value,
  options,
}: {
  label: string;
  name: string;
  value?: string;
  options: Array<[string, string]>;
}) {
  return (
    <label className="block text-sm font-medium">
      {label}
      <select
        name={name}
        defaultValue={value ?? ""}
        className="mt-1 block w-full rounded border border-rule bg-white px-3 py-2 text-base"
      >
        <option value="">Any</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </label>
  );
}
