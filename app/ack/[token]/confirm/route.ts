import { createAckConfirmHandler } from "@/lib/notify/ack-route";

// The one-click acknowledge link's POST; the token in the path is the credential (see lib/notify/ack-route.ts).
export const POST = createAckConfirmHandler();
