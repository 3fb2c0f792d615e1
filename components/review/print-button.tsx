"use client";

import { Printer } from "lucide-react";
import { Button } from "@/components/ui/button";

export function PrintButton() {
  return (
    <Button onClick={() => window.print()} className="no-print" size="sm">
      <Printer aria-hidden className="h-4 w-4" /> Print
    </Button>
  );
}
