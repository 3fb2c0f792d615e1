import type { TaskState } from "@/db/schema/tasks";
import { can, hasRole, type Role } from "@/lib/auth/roles";
import type { TaskCard } from "@/lib/data/tasks";
import type { TaskAction } from "./task-card";

interface Viewer {
  id: string;
  role: Role;
}

/**
 * The moves a viewer may make on a task, mirroring the server's checks (observers and coordinators claim and work
 * tasks, only the claimer or a coordinator moves a claimed task, shifters and coordinators cancel). The server decides.
 */
export function taskActionsFor(task: TaskCard, viewer: Viewer): TaskAction[] {
  const claims = hasRole(viewer, can.claimTask);
  const plans = hasRole(viewer, can.planFollowUp);
  const holder = viewer.role === "coordinator" || task.claimedBy?.id === viewer.id;
  const actions: TaskAction[] = [];
  const add = (to: TaskState, label: string) => actions.push({ to, label });
  if (task.state === "open" && claims && !task.candidate.withdrawn) add("claimed", "Claim");
  if (task.state === "claimed" && claims && holder) {
    add("observing", "Start observing");
    add("reported", "Report");
    add("open", "Release");
  }
  if (task.state === "observing" && claims && holder) add("reported", "Report");
  if ((task.state === "open" || task.state === "claimed" || task.state === "observing") && plans) add("cancelled", "Cancel");
  return actions;
}
