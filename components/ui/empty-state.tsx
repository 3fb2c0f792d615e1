import type { LucideIcon } from "lucide-react";

/** Says what will appear here, so an empty screen at 3 a.m. is not mistaken for a broken one. */
export function EmptyState({
  icon: Icon,
  title,
  children,
  action,
}: {
  icon: LucideIcon;
  title: string;
  children?: React.ReactNode;
  action?: React.ReactNode;
}) {
  return (
    <div className="flex flex-col items-center justify-center rounded-lg border border-dashed border-line bg-sunken px-6 py-12 text-center">
      <Icon aria-hidden className="mb-3 h-8 w-8 text-faint" />
      <p className="font-medium">{title}</p>
      {children ? <div className="mt-1 max-w-md text-sm text-muted">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
