import type { RotaPerson, ShiftView } from "@/lib/data/rota";

export type { RotaPerson, ShiftView };

export type RotaIssueJson =
  | { kind: "overlap"; shiftIds: [string, string]; from: string; to: string }
  | { kind: "gap"; from: string; to: string };

export interface RotaResponse {
  shifts: ShiftView[];
  issues: RotaIssueJson[];
}
