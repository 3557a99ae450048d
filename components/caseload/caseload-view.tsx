"use client";
// The caseload table (cards on phones): search, one filter, sort and pages held in the address
// bar, data from GET /api/caseload through TanStack Query (first page rendered on the server).
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useLocale, useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useEffect, useId, useMemo, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import type { CaseloadPage, CaseloadRow } from "@/lib/shared/dto";
import { Link } from "@/lib/i18n/navigation";
import {
  CASELOAD_DEFAULT_PAGE_SIZE,
  caseloadFilters,
  caseloadSorts,
  type CaseloadFilter,
  type CaseloadQuery,
  type CaseloadSort,
} from "@/lib/validations/caseload";
import { TrialUnderWay } from "@/components/twoc/trial-under-way";
import { LevelBadge } from "./level-badge";
import { caseloadKeys } from "./query-keys";
import { StateBadge, StateIcon } from "./state-badge";

const pageSizes = [10, 25, 50, 100];

function toSearch(q: CaseloadQuery): URLSearchParams {
  const p = new URLSearchParams();
  if (q.q) p.set("q", q.q);
  if (q.filter) p.set("filter", q.filter);
  if (q.sort !== "next-change") p.set("sort", q.sort);
  if (q.dir !== "asc") p.set("dir", q.dir);
  if (q.page !== 1) p.set("page", String(q.page));
  if (q.pageSize !== CASELOAD_DEFAULT_PAGE_SIZE) p.set("pageSize", String(q.pageSize));
  return p;
}

async function fetchCaseload(q: CaseloadQuery): Promise<CaseloadPage> {
  const params = toSearch(q);
  // Always send the page size, so the server's default can change without the client noticing.
  params.set("pageSize", String(q.pageSize));
  return apiFetch<CaseloadPage>(`/api/caseload?${params}`);
}

export function CaseloadView({ initialQuery, initialData }: { initialQuery: CaseloadQuery; initialData: CaseloadPage }) {
  const t = useTranslations("Caseload");
  const locale = useLocale();
  const [query, setQuery] = useState<CaseloadQuery>(initialQuery);
  const [searchText, setSearchText] = useState(initialQuery.q ?? "");
  const searchId = useId();
  const first = useRef(true);

  const { data, isFetching, isError, refetch } = useQuery({
    queryKey: caseloadKeys.list(query),
    queryFn: () => fetchCaseload(query),
    initialData: query === initialQuery ? initialData : undefined,
    placeholderData: keepPreviousData,
  });

  // Search as the nurse types, after a short pause.
  useEffect(() => {
    const text = searchText.trim();
    if ((query.q ?? "") === text) return;
    const timer = setTimeout(() => setQuery((q) => ({ ...q, q: text || undefined, page: 1 })), 300);
    return () => clearTimeout(timer);
  }, [searchText, query.q]);

  // Keep the address bar in step, without a server round trip, so a reload or a shared link
  // shows the same view.
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    const search = toSearch(query).toString();
    window.history.replaceState(window.history.state, "", `${window.location.pathname}${search ? `?${search}` : ""}`);
  }, [query]);

  const update = (patch: Partial<CaseloadQuery>) => setQuery((q) => ({ ...q, page: 1, ...patch }));
  const sortBy = (sort: CaseloadSort) =>
    update({ sort, dir: query.sort === sort && query.dir === "asc" ? "desc" : "asc" });

  const page = data ?? initialData;
  const pages = Math.max(1, Math.ceil(page.total / query.pageSize));
  const exportHref = useMemo(() => {
    const p = toSearch({ ...query, page: 1, pageSize: CASELOAD_DEFAULT_PAGE_SIZE });
    p.set("locale", locale);
    return `/api/caseload/export?${p}`;
  }, [query, locale]);

  const filterLabel: Record<CaseloadFilter | "all", string> = {
    all: t("filters.all"),
    overdue: t("filters.overdue"),
    "due-soon": t("filters.due-soon", { days: page.dueSoonDays }),
    urgent: t("filters.urgent"),
    twoc: t("filters.twoc"),
    "follow-up": t("filters.follow-up"),
  };

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-4">
        <div className="flex flex-col gap-1">
          <label htmlFor={searchId} className="font-bold">
            {t("searchLabel")}
          </label>
          <input
            id={searchId}
            type="search"
            value={searchText}
            onChange={(e) => setSearchText(e.target.value)}
            maxLength={100}
            autoComplete="off"
            placeholder={t("searchPlaceholder")}
            className="min-h-12 w-full rounded-lg border-2 border-stone-line bg-paper-raised px-3 md:max-w-md"
          />
        </div>
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 font-bold">{t("filterLabel")}</legend>
          <div className="flex flex-wrap gap-2">
            {(["all", ...caseloadFilters] as const).map((f) => {
              const active = (query.filter ?? "all") === f;
              return (
                <button
                  key={f}
                  type="button"
                  aria-pressed={active}
                  onClick={() => update({ filter: f === "all" ? undefined : f })}
                  className={`min-h-11 rounded-full border-2 px-4 font-bold ${
                    active ? "border-brand bg-brand text-white" : "border-stone-line bg-paper-raised text-brand hover:bg-brand-soft"
                  }`}
                >
                  {filterLabel[f]}
                </button>
              );
            })}
          </div>
        </fieldset>
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1">
            <span className="font-bold">{t("sortLabel")}</span>
            <select
              value={query.sort}
              onChange={(e) => update({ sort: e.target.value as CaseloadSort })}
              className="min-h-11 rounded-lg border-2 border-stone-line bg-paper-raised px-2"
            >
              {caseloadSorts.map((s) => (
                <option key={s} value={s}>
                  {t(`sorts.${s}`)}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1">
            <span className="font-bold">{t("dirLabel")}</span>
            <select
              value={query.dir}
              onChange={(e) => update({ dir: e.target.value as "asc" | "desc" })}
              className="min-h-11 rounded-lg border-2 border-stone-line bg-paper-raised px-2"
            >
              <option value="asc">{t(`dir.asc.${query.sort}`)}</option>
              <option value="desc">{t(`dir.desc.${query.sort}`)}</option>
            </select>
          </label>
          <a
            href={exportHref}
            download
            className="inline-flex min-h-11 items-center gap-2 rounded-lg border-2 border-brand px-4 font-bold text-brand hover:bg-brand-soft md:ms-auto"
          >
            <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
              <path d="M8 2v8m0 0-3-3m3 3 3-3M2.5 13.5h11" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
            </svg>
            {t("export")}
          </a>
        </div>
      </div>

      <p className="tabular text-ink-soft" aria-live="polite" data-testid="caseload-count">
        {isFetching ? t("updating") : page.totalIsAtLeast ? t("countAtLeast", { count: page.total }) : t("count", { count: page.total })}
      </p>

      {isError ? (
        <ErrorAlert message={t("loadFailed")} testId="caseload-error">
          <Button variant="secondary" className="mt-2" onClick={() => refetch()}>
            {t("retry")}
          </Button>
        </ErrorAlert>
      ) : null}

      {page.rows.length === 0 ? (
        <p className="rounded-card border border-stone-faint bg-paper-raised p-5" data-testid="caseload-empty">
          {query.q || query.filter ? t("noMatch") : t("empty")}
        </p>
      ) : (
        <>
          <CaseloadTable rows={page.rows} query={query} onSort={sortBy} />
          <CaseloadCards rows={page.rows} />
        </>
      )}

      <nav aria-label={t("pagesLabel")} className="flex flex-wrap items-center gap-3">
        <button
          type="button"
          disabled={query.page <= 1}
          onClick={() => setQuery((q) => ({ ...q, page: q.page - 1 }))}
          className="min-h-11 rounded-lg border-2 border-brand px-4 font-bold text-brand disabled:border-stone-faint disabled:text-stone"
        >
          {t("previous")}
        </button>
        <span className="tabular">{t(page.totalIsAtLeast ? "pageOfAtLeast" : "pageOf", { page: query.page, pages })}</span>
        <button
          type="button"
          disabled={query.page >= pages && !page.totalIsAtLeast}
          onClick={() => setQuery((q) => ({ ...q, page: q.page + 1 }))}
          className="min-h-11 rounded-lg border-2 border-brand px-4 font-bold text-brand disabled:border-stone-faint disabled:text-stone"
        >
          {t("next")}
        </button>
        <label className="flex items-center gap-2 md:ms-auto">
          <span>{t("pageSize")}</span>
          <select
            value={query.pageSize}
            onChange={(e) => update({ pageSize: Number(e.target.value) })}
            className="min-h-11 rounded-lg border-2 border-stone-line bg-paper-raised px-2"
          >
            {pageSizes.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </nav>
      <p className="text-sm text-ink-soft">{t("safety", { days: page.dueSoonDays })}</p>
    </div>
  );
}

function useCells() {
  const t = useTranslations("Caseload");
  const v = useTranslations("Vocabulary");
  const format = useFormat();
  const date = (d: string | null) => (d ? format.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "medium" }) : "—");
  const device = (r: CaseloadRow) => (r.route ? `${v(`route.${r.route}`)} · ${v("device.sizeCh", { ch: r.sizeCh ?? 0 })}` : t("noDevice"));
  const days = (r: CaseloadRow) => (r.daysSinceInsertion === null ? "—" : t("days", { count: r.daysSinceInsertion }));
  return { t, v, date, device, days };
}

/** A trial planned (its day and the medicine given before it), or the follow-up after a passed one. */
function TwocPlanLines({ row: r }: { row: CaseloadRow }) {
  const { t, date } = useCells();
  if (r.followUp) {
    return (
      <div className="text-sm font-bold text-brand" data-testid="follow-up">
        {t("followUp")}
      </div>
    );
  }
  if (!r.awaitingTwoc && !r.twocPlannedOn) return null;
  return (
    <div className="text-sm text-level-soon-ink" data-testid="twoc-planned">
      <div className="font-bold">{r.twocPlannedOn ? t("twocPlanned", { date: date(r.twocPlannedOn) }) : t("awaitingTwoc")}</div>
      {r.twocMedicineNote ? <div className="[overflow-wrap:break-word]">{t("twocMedicine", { note: r.twocMedicineNote })}</div> : null}
    </div>
  );
}

function DateWithState({ date, state }: { date: string; state: CaseloadRow["changeState"] }) {
  const t = useTranslations("CaseloadState");
  return (
    <span className="inline-flex items-center gap-1.5">
      {state && state !== "ok" ? (
        <span className={state === "overdue" ? "text-level-emergency-ink" : "text-level-urgent-ink"}>
          <StateIcon state={state} />
          <span className="sr-only">{t(state)}</span>
        </span>
      ) : null}
      <span className={state === "overdue" ? "font-bold text-level-emergency-ink" : ""}>{date}</span>
    </span>
  );
}

function CaseloadTable({ rows, query, onSort }: { rows: CaseloadRow[]; query: CaseloadQuery; onSort: (s: CaseloadSort) => void }) {
  const { t, v, date, days } = useCells();
  const header = (label: string, sort?: CaseloadSort) => {
    if (!sort) return <th scope="col" className="px-2.5 py-3 text-start align-bottom">{label}</th>;
    const active = query.sort === sort;
    return (
      <th scope="col" className="px-2.5 py-3 text-start align-bottom" aria-sort={active ? (query.dir === "asc" ? "ascending" : "descending") : "none"}>
        <button type="button" onClick={() => onSort(sort)} className="inline-flex items-center gap-1 font-bold text-brand underline-offset-4 hover:underline">
          {label}
          <span aria-hidden="true">{active ? (query.dir === "asc" ? "▲" : "▼") : "↕"}</span>
        </button>
      </th>
    );
  };
  return (
    <div className="hidden overflow-x-auto rounded-card border border-stone-faint bg-paper-raised min-[641px]:block" data-testid="caseload-table">
      <table className="w-full">
        <caption className="sr-only">{t("tableCaption")}</caption>
        <thead className="bg-paper-sunk">
          <tr>
            {header(t("patient"), "name")}
            {header(t("device"))}
            {header(t("daysSince"), "days-inserted")}
            {header(t("nextChange"), "next-change")}
            {header(t("review"), "review")}
            {header(t("checkIn"))}
            {header(t("state"))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.patientId} className="border-t border-stone-faint align-top">
              <td className="px-2.5 py-3">
                <Link href={`/patients/${r.patientId}`} className="whitespace-nowrap font-bold text-brand underline underline-offset-4">
                  {r.name}
                </Link>
                <div className="tabular whitespace-nowrap text-sm text-ink-soft">{r.healthRecordNumber}</div>
                <TwocPlanLines row={r} />
                <TrialUnderWay row={r} />
              </td>
              <td className="tabular whitespace-nowrap px-2.5 py-3">
                {r.route ? (
                  <>
                    <span className="block">{v(`route.${r.route}`)}</span>
                    <span className="block">{v("device.sizeCh", { ch: r.sizeCh ?? 0 })}</span>
                  </>
                ) : (
                  t("noDevice")
                )}
              </td>
              <td className="tabular whitespace-nowrap px-2.5 py-3">{days(r)}</td>
              <td className="tabular whitespace-nowrap px-2.5 py-3">
                <DateWithState date={date(r.plannedChangeOn)} state={r.changeState} />
              </td>
              <td className="tabular whitespace-nowrap px-2.5 py-3">
                <DateWithState date={date(r.reviewDueOn)} state={r.reviewState} />
              </td>
              <td className="px-2.5 py-3">{r.latestCheckInLevel ? <LevelBadge level={r.latestCheckInLevel} /> : <span className="text-ink-soft">{t("noCheckIn")}</span>}</td>
              <td className="px-2.5 py-3">{r.state ? <StateBadge state={r.state} /> : "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function CaseloadCards({ rows }: { rows: CaseloadRow[] }) {
  const { t, date, device, days } = useCells();
  return (
    <ul className="flex flex-col gap-3 min-[641px]:hidden" data-testid="caseload-cards">
      {rows.map((r) => (
        <li key={r.patientId} className="rounded-card border border-stone-faint bg-paper-raised p-4">
          <div className="flex flex-wrap items-start justify-between gap-2">
            <div>
              <Link href={`/patients/${r.patientId}`} className="text-lg font-bold text-brand underline underline-offset-4">
                {r.name}
              </Link>
              <div className="tabular text-sm text-ink-soft">{r.healthRecordNumber}</div>
            </div>
            {r.state ? <StateBadge state={r.state} /> : null}
          </div>
          <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
            <dt className="text-ink-soft">{t("device")}</dt>
            <dd className="tabular">{device(r)}</dd>
            <dt className="text-ink-soft">{t("daysSince")}</dt>
            <dd className="tabular">{days(r)}</dd>
            <dt className="text-ink-soft">{t("nextChange")}</dt>
            <dd className="tabular">
              <DateWithState date={date(r.plannedChangeOn)} state={r.changeState} />
            </dd>
            <dt className="text-ink-soft">{t("review")}</dt>
            <dd className="tabular">
              <DateWithState date={date(r.reviewDueOn)} state={r.reviewState} />
            </dd>
            <dt className="text-ink-soft">{t("checkIn")}</dt>
            <dd>{r.latestCheckInLevel ? <LevelBadge level={r.latestCheckInLevel} /> : t("noCheckIn")}</dd>
          </dl>
          <div className="mt-2">
            <TwocPlanLines row={r} />
          </div>
          <TrialUnderWay row={r} />
        </li>
      ))}
    </ul>
  );
}
