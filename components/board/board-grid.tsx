import { cn } from "@/components/ui/cn";

/**
 * The columns of a board. On a phone one column at a time, most of the screen wide, snapping as it is swiped;
 * from the sm breakpoint all columns abreast, scrolling sideways when the window is narrower than they need.
 */
export function BoardGrid({ columns, children }: { columns: 5 | 6; children: React.ReactNode }) {
  return (
    <div className="relative snap-x snap-mandatory overflow-x-auto pb-2 sm:snap-none">
      <div
        className={cn(
          "grid h-[calc(100dvh-14rem)] min-h-[28rem] auto-cols-[85%] grid-flow-col gap-2.5 sm:auto-cols-auto sm:grid-flow-row",
          // Whole class names, so Tailwind sees them.
          columns === 6 ? "sm:min-w-[66rem] sm:grid-cols-6" : "sm:min-w-[60rem] sm:grid-cols-5",
        )}
      >
        {children}
      </div>
    </div>
  );
}
