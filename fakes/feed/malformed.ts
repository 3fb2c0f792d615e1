import type { FeedCandidate } from "@/lib/validations/feed";
import type { FeedRandom } from "./random";

export interface MalformedBody {
  /** what is wrong, for the log line */
  defect: string;
  rawBody: string;
  /** the status the route should answer */
  expectedStatus: 400 | 422;
}

type Defect = (valid: FeedCandidate, rng: FeedRandom) => MalformedBody;

const clone = (payload: FeedCandidate): Record<string, unknown> => JSON.parse(JSON.stringify(payload)) as Record<string, unknown>;
const as422 = (defect: string, body: unknown): MalformedBody => ({ defect, rawBody: JSON.stringify(body), expectedStatus: 422 });

/** Ways a pipeline gets a post wrong; each one turns a valid payload into a refused body. */
const defects: Defect[] = [
  (valid) => ({ defect: "truncated JSON", rawBody: JSON.stringify(valid).slice(0, 120), expectedStatus: 400 }),
  () => ({ defect: "not JSON at all", rawBody: "revision=2&stage=confirmed", expectedStatus: 400 }),
  (valid) => {
    const body = clone(valid);
    delete body.masses;
    return as422("masses missing", body);
  },
  (valid) => as422("revision as a string", { ...clone(valid), revision: String(valid.revision) }),
  (valid) => as422("negative SNR", { ...clone(valid), networkSnr: -3 }),
  (valid) => as422("lower-case site code", { ...clone(valid), detectors: ["n1", "S1"] }),
  (valid) => as422("eventTime without a zone", { ...clone(valid), eventTime: valid.eventTime.replace("Z", "") }),
  (valid) => as422("unknown stage", { ...clone(valid), stage: "maybe" }),
  (valid) => {
    const track = valid.frequencyTrack;
    return as422("track lengths differ", { ...clone(valid), frequencyTrack: { t: track.t, f: track.f.slice(1) } });
  },
  (valid) => as422("misspelt optional field", { ...clone(valid), distanceMPC: { mean: 100, sd: 20 } }),
  (valid) => as422("zero mass", { ...clone(valid), masses: { m1: { mean: 0, sd: 0.1 }, m2: valid.masses.m2 } }),
  (valid, rng) => {
    // Just over the 200 000-sample limit: about 1.4 MB, under the 5 MB body limit.
    const n = 200_001 + rng.int(0, 50);
    const t = Array.from({ length: n }, (_, i) => -100 + i * 0.0004);
    const f = t.map(() => 30);
    return as422("track over 200 000 samples", { ...clone(valid), frequencyTrack: { t, f } });
  },
];

export function malformBody(valid: FeedCandidate, rng: FeedRandom): MalformedBody {
  // The over-long track is large; send it rarely.
  const index = rng.chance(0.08) ? defects.length - 1 : rng.int(0, defects.length - 2);
  const defect = defects[index] ?? defects[0];
  if (!defect) throw new Error("no defects defined");
  return defect(valid, rng);
}
