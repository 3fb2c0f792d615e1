import type { Role } from "@/db/schema";

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

export const demoSites = [
  { code: "ALD", name: "Alado Ridge Observatory", latitudeDeg: -30.1, longitudeDeg: -70.4, elevationM: 2300, minAltitudeDeg: 25, fieldOfViewDeg2: 9.6, timeZone: "America/Santiago", observers: ["bram@chirpdesk.test"] },
  { code: "KRN", name: "Kerrin Peak Station", latitudeDeg: 31.6, longitudeDeg: -111.2, elevationM: 2050, minAltitudeDeg: 30, fieldOfViewDeg2: 47, timeZone: "America/Phoenix", observers: ["bram@chirpdesk.test"] },
  { code: "WLB", name: "Wallaby Flats Robotic Array", latitudeDeg: -31.4, longitudeDeg: 116.9, elevationM: 390, minAltitudeDeg: 30, fieldOfViewDeg2: 4.2, timeZone: "Australia/Perth", observers: ["ines@chirpdesk.test"] },
  { code: "TRB", name: "Torbay Spectrograph Hut", latitudeDeg: 38.2, longitudeDeg: 15.1, elevationM: 1200, minAltitudeDeg: 20, fieldOfViewDeg2: 0.05, timeZone: "Europe/Rome", observers: ["ines@chirpdesk.test"] },
];
