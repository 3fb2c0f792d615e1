export * from "./users";
export * from "./candidates";
export * from "./tasks";
export * from "./sites";
export * from "./events";
export * from "./paging";
export * from "./uploads";
export * from "./settings";
