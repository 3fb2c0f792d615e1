import type { Footprint, Role } from "@/db/schema";

/**
 * The demo scenario: a fictional detector network and fictional observatories and people.
 * Nothing here names a real instrument, site, collaboration or person.
 */
export const demoNetwork = {
  name: "Tessera Array",
  detectors: [
    { code: "N1", name: "Norrvik interferometer (fictional)" },
    { code: "S1", name: "Sundra interferometer (fictional)" },
    { code: "E1", name: "Esker interferometer (fictional)" },
  ],
} as const;

export interface DemoPerson {
  email: string;
  name: string;
  initials: string;
  role: Role;
  password: string;
  timeZone: string;
}

export const demoPeople: DemoPerson[] = [
  { email: "ada@chirpdesk.test", name: "Ada Quill", initials: "AQ", role: "shifter", password: "demo-shifter", timeZone: "Europe/Berlin" },
  { email: "emil@chirpdesk.test", name: "Emil Varga", initials: "EV", role: "shifter", password: "demo-shifter", timeZone: "America/Chicago" },
  { email: "bram@chirpdesk.test", name: "Bram Osei", initials: "BO", role: "observer", password: "demo-observer", timeZone: "America/Santiago" },
  { email: "ines@chirpdesk.test", name: "Ines Halvorsen", initials: "IH", role: "observer", password: "demo-observer", timeZone: "Australia/Perth" },
  { email: "cleo@chirpdesk.test", name: "Cleo Marsh", initials: "CM", role: "coordinator", password: "demo-coordinator", timeZone: "UTC" },
  { email: "dara@chirpdesk.test", name: "Dara Finch", initials: "DF", role: "admin", password: "demo-admin", timeZone: "UTC" },
];

/** A demo instrument; the seed stores it as is. Footprints give roughly each site's old single field area. */
export interface DemoInstrument {
  name: string;
  footprint: Footprint;
  filters: string[];
  exposureS: number;
  overheadS: number;
  limitingMag: number | null;
}

export const demoSites = [
  {
    code: "ALD", name: "Alado Ridge Observatory", latitudeDeg: -30.1, longitudeDeg: -70.4, elevationM: 2300, minAltitudeDeg: 25, fieldOfViewDeg2: 9.6, timeZone: "America/Santiago", observers: ["bram@chirpdesk.test"],
    instruments: [
      { name: "Ridge wide camera", footprint: { shape: "rectangle", widthDeg: 3.2, heightDeg: 3 }, filters: ["g", "r", "i"], exposureS: 90, overheadS: 25, limitingMag: 21 },
      { name: "Ridge imager", footprint: { shape: "rectangle", widthDeg: 0.6, heightDeg: 0.6 }, filters: ["r", "z"], exposureS: 180, overheadS: 40, limitingMag: 22.5 },
    ],
  },
  {
    code: "KRN", name: "Kerrin Peak Station", latitudeDeg: 31.6, longitudeDeg: -111.2, elevationM: 2050, minAltitudeDeg: 30, fieldOfViewDeg2: 47, timeZone: "America/Phoenix", observers: ["bram@chirpdesk.test"],
    instruments: [{ name: "Kerrin survey camera", footprint: { shape: "rectangle", widthDeg: 7, heightDeg: 6.7 }, filters: ["g", "r"], exposureS: 60, overheadS: 30, limitingMag: 19.5 }],
  },
  {
    code: "WLB", name: "Wallaby Flats Robotic Array", latitudeDeg: -31.4, longitudeDeg: 116.9, elevationM: 390, minAltitudeDeg: 30, fieldOfViewDeg2: 4.2, timeZone: "Australia/Perth", observers: ["ines@chirpdesk.test"],
    instruments: [{ name: "Array unit", footprint: { shape: "circle", radiusDeg: 1.16 }, filters: ["clear", "r"], exposureS: 120, overheadS: 15, limitingMag: 18.5 }],
  },
  {
    code: "TRB", name: "Torbay Spectrograph Hut", latitudeDeg: 38.2, longitudeDeg: 15.1, elevationM: 1200, minAltitudeDeg: 20, fieldOfViewDeg2: 0.05, timeZone: "Europe/Rome", observers: ["ines@chirpdesk.test"],
    instruments: [{ name: "Slit spectrograph", footprint: { shape: "circle", radiusDeg: 0.126 }, filters: [], exposureS: 600, overheadS: 120, limitingMag: null }],
  },
] satisfies Array<Record<string, unknown> & { instruments: DemoInstrument[] }>;
