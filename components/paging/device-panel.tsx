"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { BellOff, BellPlus, Send, Smartphone, Trash2 } from "lucide-react";
import { useEffect, useState, useSyncExternalStore } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiClientError } from "@/lib/api-client";
import { currentSubscription, deviceLabel, pushSupport, subscribeThisDevice, type PushSupport } from "./push-device";
import { pagingKeys } from "./query-keys";
import type { DeviceView } from "./types";
import { ZonedTime } from "./zoned-time";

const supportText: Record<Exclude<PushSupport, "supported">, string> = {
  unsupported: "This browser cannot receive web push. Pages still reach you by e-mail and in the app.",
  denied: "Notifications are blocked for this site in this browser's settings; allow them to turn push on.",
  insecure: "Web push needs HTTPS (or localhost).",
};

const noSubscription = () => () => undefined;

const message = (e: unknown) => (e instanceof ApiClientError || e instanceof Error ? e.message : "something went wrong");

/** This browser's push subscription, the person's other devices, and a test page. */
export function DevicePanel({ timeZone }: { timeZone: string }) {
  const queryClient = useQueryClient();
  // The browser's answer, read after hydration (the server renders "unsupported").
  const support = useSyncExternalStore(noSubscription, pushSupport, () => "unsupported" as PushSupport);
  const [thisEndpoint, setThisEndpoint] = useState<string | null>(null);
  useEffect(() => {
    void currentSubscription().then((s) => setThisEndpoint(s?.endpoint ?? null), () => setThisEndpoint(null));
  }, []);

  const devices = useQuery({ queryKey: pagingKeys.devices, queryFn: () => apiFetch<{ items: DeviceView[] }>("/api/v1/push/subscriptions") });
  const refresh = () => queryClient.invalidateQueries({ queryKey: pagingKeys.devices });

  const subscribe = useMutation({
    mutationFn: async () => {
      const { publicKey } = await apiFetch<{ publicKey: string }>("/api/v1/push/vapid-public-key");
      const sub = await subscribeThisDevice(publicKey);
      await apiFetch("/api/v1/push/subscriptions", { method: "POST", json: { ...sub, label: deviceLabel() } });
      return sub.endpoint ?? null;
    },
    onSuccess: (endpoint) => {
      setThisEndpoint(endpoint);
      toast.success("Push is on for this device.");
    },
    onError: (e) => toast.error(`Could not turn push on: ${message(e)}`),
    onSettled: refresh,
  });
  const unsubscribe = useMutation({
    mutationFn: async () => {
      const sub = await currentSubscription();
      if (!sub) return;
      await apiFetch("/api/v1/push/unsubscribe", { method: "POST", json: { endpoint: sub.endpoint } }).catch(() => undefined);
      await sub.unsubscribe();
    },
    onSuccess: () => {
      setThisEndpoint(null);
      toast.success("Push is off for this device.");
    },
    onError: (e) => toast.error(`Could not turn push off: ${message(e)}`),
    onSettled: refresh,
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/push/subscriptions/${encodeURIComponent(id)}`, { method: "DELETE" }),
    onError: (e) => toast.error(message(e)),
    onSettled: refresh,
  });
  const test = useMutation({
    mutationFn: () => apiFetch("/api/v1/push/test", { method: "POST" }),
    onSuccess: () => toast.success("Test page queued: watch this device, your inbox and the bell."),
    onError: (e) => toast.error(message(e)),
  });

  const items = devices.data?.items ?? [];
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        {support === "supported" ? (
          thisEndpoint ? (
            <Button variant="secondary" size="sm" onClick={() => unsubscribe.mutate()} disabled={unsubscribe.isPending}>
              <BellOff aria-hidden className="h-4 w-4" /> Turn off push on this device
            </Button>
          ) : (
            <Button variant="primary" size="sm" onClick={() => subscribe.mutate()} disabled={subscribe.isPending}>
              <BellPlus aria-hidden className="h-4 w-4" /> {subscribe.isPending ? "Asking the browser…" : "Turn on push on this device"}
            </Button>
          )
        ) : (
          <p className="text-sm text-warn">{supportText[support]}</p>
        )}
        <Button variant="ghost" size="sm" onClick={() => test.mutate()} disabled={test.isPending}>
          <Send aria-hidden className="h-4 w-4" /> Send me a test page
        </Button>
      </div>
      {items.length === 0 ? (
        <p className="text-sm text-muted">No devices receive push for you yet.</p>
      ) : (
        <ul className="divide-y divide-line rounded-md border border-line" data-testid="push-devices">
          {items.map((d) => (
            <li key={d.id} className="flex flex-wrap items-center gap-3 px-3 py-2 text-sm">
              <Smartphone aria-hidden className="h-4 w-4 text-muted" />
              <span className="font-medium">{d.label || "Unnamed device"}</span>
              <span className="text-xs text-faint">via {d.service}</span>
              <span className="text-xs text-faint">
                {d.lastSuccessAt ? (
                  <>
                    last reached <ZonedTime at={d.lastSuccessAt} timeZone={timeZone} />
                  </>
                ) : (
                  "not reached yet"
                )}
              </span>
              <Button size="sm" variant="ghost" className="ml-auto" aria-label={`Remove ${d.label || "device"}`} onClick={() => remove.mutate(d.id)}>
                <Trash2 aria-hidden className="h-4 w-4" />
              </Button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
