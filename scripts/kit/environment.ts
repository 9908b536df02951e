// `$app/environment` for scripts run outside Vite: never the build step, never a browser.
export const building = false;
export const browser = false;
export const dev = false;
export const version = 'script';
