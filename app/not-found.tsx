import { SearchX } from "lucide-react";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata = { title: "Not found" };

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg p-8">
      <EmptyState
        icon={SearchX}
        title="Nothing here"
        action={
          <Link className="text-accent underline" href="/">
            Back to your start page
          </Link>
        }
      >
        The page or candidate you asked for does not exist, or was never received.
      </EmptyState>
    </main>
  );
}
