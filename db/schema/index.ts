export * from "./auth";
export * from "./audit";
export * from "./firm";
export * from "./standards";
export * from "./libraries";
export * from "./jobs";
export * from "./calcs";
export * from "./withdrawals";
