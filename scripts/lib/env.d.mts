// Types for the parts of env.mjs that TypeScript scripts use (the benchmarks).
export function portsFor(profile: "start" | "test"): { postgres: number; smtp: number; mailApi: number; s3: number; app: number };
export function databaseUrlFor(profile: "start" | "test", role: "app" | "owner" | "superuser", database?: string): string;
export function loadEnvLocalDefaults(): void;
export function logSigningKey(): { key: string; created: boolean };
export function logPublicKey(signingKey: string): string;
