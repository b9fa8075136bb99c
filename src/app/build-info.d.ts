/** The build marker, set by vite.config.ts `define` (FLOE_BUILD_ID or the build time). */
declare const __FLOE_BUILD__: string;
/** The ship server origins the build's security policy allows (FLOE_SHIP_SERVER at build time). */
declare const __FLOE_SHIP_SERVERS__: string[];
