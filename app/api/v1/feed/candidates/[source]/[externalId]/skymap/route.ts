import { createFeedSkymapHandler } from "./feed-skymap-handler";

/** The feed attaches a sky map to a candidate it posted; signed like the ingest route (see the handler). */
export const POST = createFeedSkymapHandler();
