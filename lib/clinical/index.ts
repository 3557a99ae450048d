/**
 * lib/clinical: the clinical computation Caddis owns. Pure TypeScript, runs in the
 * browser and on the server. Every result is decision support: local policy, the
 * maker's instructions and clinical judgement come first.
 */
export * from "./errors";
export * from "./sources";
export * from "./dates";
export * from "./news2";
export * from "./news2-home";
export * from "./gtin";
export * from "./gs1";
export * from "./size";
export * from "./device-types";
export * from "./record-vocabulary";
export * from "./device-check";
export * from "./plan-dates";
export * from "./allergies";
export * from "./blockage";
export * from "./supplies";
export * from "./fluid";
export * from "./triage";
export * from "./twoc";
