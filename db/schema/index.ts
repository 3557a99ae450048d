export * from "./auth";
export * from "./app";
