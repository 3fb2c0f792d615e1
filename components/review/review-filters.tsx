import { Download, RotateCcw } from "lucide-react";
import Link from "next/link";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { sourceClasses, stages } from "@/db/schema/candidates";
import { classLabels } from "@/lib/format/classes";
import { stageLabels } from "@/components/candidate/stage-badge";
import { dateInputIso } from "@/components/ui/iso-inputs";

export interface FilterChoices {
  shifts: Array<{ id: string; label: string }>;
  people: Array<{ id: string; name: string }>;
  sites: Array<{ id: string; code: string; name: string }>;
}

export interface FilterValues {
  from: string;
  to: string;
  class?: string;
  stage?: string;
  shift?: string;
  person?: string;
  site?: string;
}

const label = "mb-1 block text-xs font-medium text-muted";

/** A plain GET form: the filters live in the URL, so a view can be bookmarked, shared, and works before scripts load. */
export function ReviewFilters({ values, choices, exportQuery, timeZone }: { values: FilterValues; choices: FilterChoices; exportQuery: string; timeZone: string }) {
  return (
    <form method="get" action="/review" className="no-print mb-4 rounded-lg border border-line bg-surface p-3" aria-label="Review filters">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4 xl:grid-cols-8">
        <div>
          <label htmlFor="f-from" className={label}>From</label>
          <Input id="f-from" name="from" {...dateInputIso} defaultValue={values.from} required />
        </div>
        <div>
          <label htmlFor="f-to" className={label}>To (inclusive)</label>
          <Input id="f-to" name="to" {...dateInputIso} defaultValue={values.to} required />
        </div>
        <Choice id="f-class" name="class" text="Class" value={values.class} options={sourceClasses.map((c) => [c, classLabels[c]])} />
        <Choice id="f-stage" name="stage" text="Stage" value={values.stage} options={stages.map((s) => [s, stageLabels[s]])} />
        <Choice id="f-shift" name="shift" text="Shift" value={values.shift} options={choices.shifts.map((s) => [s.id, s.label])} />
        <Choice id="f-person" name="person" text="Person" value={values.person} options={choices.people.map((p) => [p.id, p.name])} />
        <Choice id="f-site" name="site" text="Site" value={values.site} options={choices.sites.map((s) => [s.id, `${s.code} · ${s.name}`])} />
        <div className="flex items-end gap-2">
          <Button type="submit" variant="primary" size="md" className="flex-1">Apply</Button>
          <Link href="/review" className="inline-flex h-10 items-center rounded-md px-2 text-muted hover:bg-raised hover:text-fg" title="Reset filters" aria-label="Reset filters">
            <RotateCcw aria-hidden className="h-4 w-4" />
          </Link>
        </div>
      </div>
      <div className="mt-2 flex flex-wrap items-center justify-between gap-2 text-xs text-muted">
        <span>Days in {timeZone}; candidates counted by receipt time.</span>
        <a href={`/api/v1/review/export?${exportQuery}`} className="inline-flex items-center gap-1 text-accent hover:underline" download>
          <Download aria-hidden className="h-3.5 w-3.5" /> Per-candidate table (CSV)
        </a>
      </div>
    </form>
  );
}

function Choice({ id, name, text, value, options }: { id: string; name: string; text: string; value?: string; options: Array<[string, string]> }) {
  return (
    <div>
      <label htmlFor={id} className={label}>{text}</label>
      <Select id={id} name={name} defaultValue={value ?? ""}>
        <option value="">All</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>{l}</option>
        ))}
      </Select>
    </div>
  );
}
