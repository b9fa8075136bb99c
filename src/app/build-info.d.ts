/** The build marker, set by vite.config.ts `define` (FLOE_BUILD_ID or the build time). */
declare const __FLOE_BUILD__: string;
