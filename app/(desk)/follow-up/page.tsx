import { FollowUpBoard } from "@/components/board/follow-up-board";
import type { TaskFilterValues } from "@/components/board/task-filters";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { listSiteOptions, listTasks } from "@/lib/data/tasks";
import { taskListQuerySchema } from "@/lib/validations/tasks";

export const metadata = { title: "Follow-up board" };
export const dynamic = "force-dynamic";

export default async function FollowUpPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser();
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  const parsed = taskListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : taskListQuerySchema.parse({});
  const filters: TaskFilterValues = { site: query.site ?? "", kind: query.kind ?? "", candidate: query.candidate ?? "", mine: query.mine };
  const [tasks, sites] = await Promise.all([listTasks(query, user), listSiteOptions()]);
  return (
    <>
      <PageHeader
        title="Follow-up board"
        description="Observation tasks from candidates that went for follow-up. Observers claim a task by dragging it to Claimed or pressing Claim; the first claim wins."
      />
      <FollowUpBoard
        initialTasks={tasks}
        initialFilters={filters}
        sites={sites}
        viewer={{ id: user.id, name: user.name, initials: user.initials, role: user.role, timeZone: user.timeZone }}
      />
    </>
  );
}
