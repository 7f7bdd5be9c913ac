/**
 * How large a request body may be: 1 MiB, the size Next.js itself allows a server action by
 * default. An event, a form or a sign-in is a few kilobytes. The production server refuses
 * larger bodies unread (src/server/platform/front-door.ts); next.config.ts gives Next's server actions
 * the same figure. No imports: next.config.ts loads this file.
 */
export const MAX_BODY_BYTES = 1024 * 1024;
