// `$env/dynamic/private` for scripts run outside Vite: the process's environment (scripts/env.ts
// loads the project's env file into it first).
export const env: Record<string, string | undefined> = process.env;
