/**
 * The database client for route handlers, middleware and plugins, auto-imported by Nitro: `useDb()`
 * without an import line. Tables are imported by name from `~~/server/db/schema`; services import
 * `useDb` and `Tx` from `~~/server/db/client` explicitly (unit tests load them without Nitro).
 */
export { useDb } from '../db/client'
