"use client";
// The clash table (TanStack Table v9): sortable columns, filters by system, state, outcome and the member's
// force state over all combinations, assignee and due date, and grouping by run, system or grid zone (group
// headers drawn between the sorted rows, lib/clash/groups.ts). Selecting a row flies the viewer to the clash and
// selects its member; its history is in the decision panel. Below the lg breakpoint the same rows are cards (a
// phone or tablet cannot show eleven columns); on wider screens the actions come first so a table wider than its
// column scrolls without ever hiding "Show in 3D" and "Thread" (issue 17 item 11).
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_equals,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
} from "@tanstack/react-table";
import Link from "next/link";
import { Fragment, useMemo, useState } from "react";
import { ENVELOPE_STATE_LABELS, type EnvelopeState } from "@/lib/clash/envelope-state";
import { CLASH_KIND_LABELS, CLASH_OUTCOME_LABELS, type ClashOutcome } from "@/lib/clash/outcomes";
import { CLASH_GROUPINGS, CLASH_GROUPING_LABELS, groupKey, groupRows, type ClashGrouping } from "@/lib/clash/groups";
import type { ClashRowData } from "./types";

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  filterFns: { equals: filterFn_equals },
});
const helper = createColumnHelper<typeof features, ClashRowData>();

const kN = (v: number | null) => (v === null ? "–" : v.toFixed(1));
/** Clash state in one word: kind while active, or cleared when the last detection no longer finds it. */
const stateOf = (row: ClashRowData) => (row.status === "cleared" ? "cleared" : row.kind);
const STATE_LABELS: Record<string, string> = { ...CLASH_KIND_LABELS, cleared: "Cleared (no longer found)" };
const outcomeOf = (row: ClashRowData) => row.outcome ?? "undecided";
const OUTCOME_LABELS: Record<string, string> = { ...CLASH_OUTCOME_LABELS, undecided: "Undecided" };

const columns = helper.columns([
  helper.accessor("memberId", { id: "member", header: "Member", sortFn: "alphanumeric" }),
  helper.accessor((row) => row.verdict ?? "", { id: "verdict", header: "Verdict", sortFn: "alphanumeric" }),
  helper.accessor((row) => row.envelopeState ?? "unknown", {
    id: "envelopeState",
    header: "Loading over all combinations",
    filterFn: "equals",
    cell: (info) => {
      const row = info.row.original;
      const state = row.envelopeState as EnvelopeState | null;
      return (
        <span>
          {state ? ENVELOPE_STATE_LABELS[state] : "No results"}
          <span className="ml-1 font-mono text-xs text-board-700">
            T {kN(row.maxTension)} / C {kN(row.maxCompression)} kN
          </span>
        </span>
      );
    },
  }),
  helper.accessor((row) => `${row.runId} · ${row.segmentIndex + 1}`, { id: "run", header: "Run · segment", sortFn: "alphanumeric" }),
  helper.accessor((row) => row.system ?? "", { id: "system", header: "System", filterFn: "equals", sortFn: "alphanumeric" }),
  helper.accessor(stateOf, { id: "state", header: "State", filterFn: "equals", cell: (info) => STATE_LABELS[info.getValue()] }),
  helper.accessor("depth", { id: "depth", header: "Overlap / shortfall (mm)", sortFn: "basic", cell: (info) => (info.getValue() * 1000).toFixed(0) }),
  helper.accessor(outcomeOf, { id: "outcome", header: "Outcome", filterFn: "equals", cell: (info) => OUTCOME_LABELS[info.getValue()] }),
  helper.accessor((row) => row.assignee ?? "", { id: "assignee", header: "Assignee", sortFn: "alphanumeric", cell: (info) => info.getValue() || "–" }),
  // ISO dates sort as text; undated clashes sort last when ascending.
  helper.accessor((row) => row.dueOn ?? "9999", { id: "due", header: "Due", sortFn: "alphanumeric", cell: (info) => info.row.original.dueOn ?? "–" }),
]);

const FILTERS = [
  { id: "system", label: "System" },
  { id: "state", label: "State" },
  { id: "outcome", label: "Outcome" },
  { id: "envelopeState", label: "Loading over all combinations" },
] as const;

function labelFor(filter: string, value: string): string {
  if (filter === "state") return STATE_LABELS[value] ?? value;
  if (filter === "outcome") return OUTCOME_LABELS[value as ClashOutcome | "undecided"] ?? value;
  if (filter === "envelopeState") return value === "unknown" ? "No results" : ENVELOPE_STATE_LABELS[value as EnvelopeState];
  return value;
}

/** "Show in 3D" and the link to the clash's thread, in a table row or on a card. */
function ClashActions({ row, onSelect, threadHref, testIds }: { row: ClashRowData; onSelect: (row: ClashRowData) => void; threadHref: (row: ClashRowData) => string; testIds: { show: string; thread: string } }) {
  return (
    <>
      <button type="button" className="rounded border border-board-200 px-2 py-0.5 text-xs hover:bg-board-100" onClick={() => onSelect(row)} data-testid={testIds.show}>
        Show in 3D
      </button>
      <Link className="ml-2 text-xs text-tension underline" href={threadHref(row)} data-testid={testIds.thread}>
        Thread
      </Link>
    </>
  );
}

export function ClashTable({ rows, selectedId, onSelect, threadHref }: { rows: ClashRowData[]; selectedId: string | null; onSelect: (row: ClashRowData) => void; threadHref: (row: ClashRowData) => string }) {
  const table = useTable({ features, columns, data: rows, getRowId: (row) => row.id, initialState: { sorting: [{ id: "depth", desc: true }] } });
  // Filter choices come from all rows (not the filtered ones) so every combination can be picked.
  const options = useMemo(() => {
    const values = (get: (row: ClashRowData) => string) => [...new Set(rows.map(get))].sort();
    return {
      system: values((r) => r.system ?? ""),
      state: values(stateOf),
      outcome: values(outcomeOf),
      envelopeState: values((r) => r.envelopeState ?? "unknown"),
    } as Record<(typeof FILTERS)[number]["id"], string[]>;
  }, [rows]);
  const visible = table.getRowModel().rows;
  const [grouping, setGrouping] = useState<ClashGrouping>("none");
  const groups = grouping === "none" ? [{ key: "", rows: visible }] : groupRows(visible, (row) => groupKey(row.original, grouping));

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-3" data-testid="clash-filters">
        {FILTERS.map(({ id, label }) => {
          const column = table.getColumn(id);
          return (
            <label key={id} className="flex flex-col text-xs text-board-700">
              {label}
              <select
                className="mt-1 rounded border border-board-200 bg-white px-2 py-1 text-sm text-board-900"
                value={(column?.getFilterValue() as string | undefined) ?? ""}
                onChange={(e) => column?.setFilterValue(e.target.value === "" ? undefined : e.target.value)}
                data-testid={`clash-filter-${id}`}
              >
                <option value="">All</option>
                {options[id].map((value) => (
                  <option key={value} value={value}>
                    {labelFor(id, value)}
                  </option>
                ))}
              </select>
            </label>
          );
        })}
        <label className="flex flex-col text-xs text-board-700">
          Group by
          <select
            className="mt-1 rounded border border-board-200 bg-white px-2 py-1 text-sm text-board-900"
            value={grouping}
            onChange={(e) => setGrouping(e.target.value as ClashGrouping)}
            data-testid="clash-group-by"
          >
            {CLASH_GROUPINGS.map((g) => (
              <option key={g} value={g}>
                {CLASH_GROUPING_LABELS[g]}
              </option>
            ))}
          </select>
        </label>
        <span className="text-sm text-board-700" data-testid="clash-count">
          {visible.length} of {rows.length} clashes
        </span>
      </div>
      <ul className="flex flex-col gap-2 lg:hidden" data-testid="clash-cards" aria-label="Clashes">
        {groups.map((group) => (
          <Fragment key={group.key}>
            {grouping !== "none" && (
              <li className="px-1 pt-1 text-xs font-semibold text-board-800" data-testid="clash-card-group">
                {CLASH_GROUPING_LABELS[grouping]}: {group.key} · {group.rows.length} {group.rows.length === 1 ? "clash" : "clashes"}
              </li>
            )}
            {group.rows.map((row) => (
              <li
                key={row.id}
                className={`rounded-lg border bg-white p-3 text-sm ${row.id === selectedId ? "border-selection outline outline-2 outline-selection" : "border-board-200"}`}
                data-testid="clash-card"
                data-clash-key={row.original.clashKey}
              >
                <dl className="grid grid-cols-[minmax(0,2fr)_minmax(0,3fr)] gap-x-3 gap-y-1 break-words">
                  {row.getAllCells().map((cell) => (
                    <Fragment key={cell.id}>
                      <dt className="text-xs text-board-700">{String(cell.column.columnDef.header)}</dt>
                      <dd className={cell.column.id === "member" ? "font-mono font-semibold" : ""}>
                        <table.FlexRender cell={cell} />
                      </dd>
                    </Fragment>
                  ))}
                </dl>
                <div className="mt-2">
                  <ClashActions row={row.original} onSelect={onSelect} threadHref={threadHref} testIds={{ show: "clash-card-show", thread: "clash-card-thread" }} />
                </div>
              </li>
            ))}
          </Fragment>
        ))}
        {visible.length === 0 && (
          <li className="rounded-lg border border-board-200 px-2 py-6 text-center text-sm text-board-700">
            {rows.length === 0 ? "No clashes: the runs keep their clearance from every member." : "No clash matches these filters."}
          </li>
        )}
      </ul>
      <div className="hidden overflow-x-auto rounded-lg border border-board-200 lg:block">
        <table className="w-full text-left text-sm" data-testid="clash-table">
          <thead className="bg-board-100">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                <th className="px-2 py-2 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} className="px-2 py-2 font-medium" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}>
                      <button type="button" className="hover:underline" onClick={header.column.getToggleSortingHandler()}>
                        <table.FlexRender header={header} />
                        {sorted === "asc" ? " ▲" : sorted === "desc" ? " ▼" : ""}
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {groups.map((group) => (
              <Fragment key={group.key}>
                {grouping !== "none" && (
                  <tr className="border-t border-board-200 bg-board-50" data-testid="clash-group">
                    <th colSpan={columns.length + 1} scope="rowgroup" className="px-2 py-1.5 text-left text-xs font-semibold text-board-800">
                      {CLASH_GROUPING_LABELS[grouping]}: {group.key} · {group.rows.length} {group.rows.length === 1 ? "clash" : "clashes"}
                    </th>
                  </tr>
                )}
            {group.rows.map((row) => {
              const selected = row.id === selectedId;
              return (
                <tr
                  key={row.id}
                  className={`border-t border-board-200 ${selected ? "bg-violet-50 outline outline-2 outline-selection" : "hover:bg-board-50"}`}
                  aria-selected={selected}
                  data-testid="clash-row"
                  data-clash-key={row.original.clashKey}
                >
                  <td className="whitespace-nowrap px-2 py-1.5 align-top">
                    <ClashActions row={row.original} onSelect={onSelect} threadHref={threadHref} testIds={{ show: "clash-show", thread: "clash-thread" }} />
                  </td>
                  {row.getAllCells().map((cell) => (
                    <td key={cell.id} className="px-2 py-1.5 align-top">
                      <table.FlexRender cell={cell} />
                    </td>
                  ))}
                </tr>
              );
            })}
              </Fragment>
            ))}
            {visible.length === 0 && (
              <tr>
                <td colSpan={columns.length + 1} className="px-2 py-6 text-center text-board-700">
                  {rows.length === 0 ? "No clashes: the runs keep their clearance from every member." : "No clash matches these filters."}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
