import { ShieldAlert } from "lucide-react";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata = { title: "Not for your role" };

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg p-8">
      <EmptyState icon={ShieldAlert} title="Your role cannot open that page" action={<Link className="text-accent underline" href="/">Back to your start page</Link>}>
        Ask a coordinator if you need it; roles are set under People &amp; roles.
      </EmptyState>
    </main>
  );
}
