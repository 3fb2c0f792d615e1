/** TanStack Query keys of the sky-map area. */
export const skymapKeys = {
  list: (candidateId: string) => ["skymaps", candidateId] as const,
  grid: (skymapId: string) => ["skymap-grid", skymapId] as const,
  visibility: (candidateId: string) => ["visibility", candidateId] as const,
  suggestions: (candidateId: string) => ["suggestions", candidateId] as const,
  reports: (candidateId: string) => ["reports", candidateId] as const,
  sites: ["sites"] as const,
  /** Under the sites key, so refreshing the sites refreshes their instruments too. */
  instruments: (siteId: string) => ["sites", siteId, "instruments"] as const,
  tonight: ["sites-tonight"] as const,
};

/** Distinct outline colours for site bands, in site-code order (kept apart from the contour colours). */
export const siteColours: ReadonlyArray<readonly [number, number, number]> = [
  [244, 114, 182],
  [96, 165, 250],
  [132, 204, 22],
  [192, 132, 252],
  [248, 113, 113],
  [45, 212, 191],
  [217, 70, 239],
  [226, 232, 240],
];

export const rgbCss = (c: readonly [number, number, number]) => `rgb(${c[0]} ${c[1]} ${c[2]})`;
