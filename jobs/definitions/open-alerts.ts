// Alerts that clear and come back (reorder, shortage): the scans hand over what holds now and this
// file brings the stored alerts in line, for one company and kind.
// - a subject (kitchen + item, or kitchen + batch) that holds now and has no OPEN alert gets one,
//   with episode = the subject's highest episode + 1 (0 for the first);
// - an open alert whose subject no longer holds gets `cleared_at` = the scan's clock;
// - a subject that still holds keeps its open alert as raised (nothing new, nothing rewritten).
// Two scans at once: both may try to open the same alert; the partial unique index
// `alerts_one_open` (20261202070100) and ON CONFLICT DO NOTHING keep one. A retry after a crash
// half-way repeats harmlessly. Expiry alerts are never touched here.
import type { Knex } from "knex";

export interface CurrentAlert {
  kitchenId: string;
  subjectId: string;
  title: string;
  detail: string;
  data: Record<string, unknown>;
}

export interface OpenAlertsResult {
  /** alerts opened by this run */
  created: number;
  /** open alerts this run found no longer holding */
  cleared: number;
}

const CHUNK = 500;

export async function syncOpenAlerts(
  knex: Knex,
  opts: { companyId: string; kind: "reorder" | "shortage"; subjectType: "item" | "batch"; now: Date; current: readonly CurrentAlert[] },
): Promise<OpenAlertsResult> {
  const { companyId, kind, subjectType, now, current } = opts;
  const keys = JSON.stringify(current.map((c) => ({ kitchen_id: c.kitchenId, subject_id: c.subjectId })));

  const cleared = await knex.raw<{ rows: { id: string }[] }>(
    `update alerts a set cleared_at = :now
      where a.company_id = :companyId and a.kind = :kind and a.cleared_at is null
        and not exists (select 1 from jsonb_to_recordset(:keys::jsonb) as v(kitchen_id uuid, subject_id uuid)
                         where v.kitchen_id = a.kitchen_id and v.subject_id = a.subject_id)
      returning a.id`,
    { now, companyId, kind, keys },
  );

  let created = 0;
  for (let i = 0; i < current.length; i += CHUNK) {
    const rows = JSON.stringify(
      current.slice(i, i + CHUNK).map((c) => ({ kitchen_id: c.kitchenId, subject_id: c.subjectId, title: c.title, detail: c.detail, data: c.data })),
    );
    const inserted = await knex.raw<{ rows: { id: string }[] }>(
      `insert into alerts (company_id, kitchen_id, kind, subject_type, subject_id, threshold_days, episode, title, detail, data)
       select :companyId, v.kitchen_id, :kind, :subjectType, v.subject_id, 0,
              coalesce((select max(e.episode) + 1 from alerts e
                         where e.company_id = :companyId and e.kind = :kind and e.kitchen_id = v.kitchen_id and e.subject_id = v.subject_id), 0),
              v.title, v.detail, v.data
         from jsonb_to_recordset(:rows::jsonb) as v(kitchen_id uuid, subject_id uuid, title text, detail text, data jsonb)
        where not exists (select 1 from alerts o
                           where o.company_id = :companyId and o.kind = :kind and o.kitchen_id = v.kitchen_id
                             and o.subject_id = v.subject_id and o.cleared_at is null)
       on conflict do nothing
       returning id`,
      { companyId, kind, subjectType, rows },
    );
    created += inserted.rows.length;
  }
  return { created, cleared: cleared.rows.length };
}
