// Ids are PostgreSQL uuids; a malformed one must never reach a query (PostgreSQL refuses it with an error).
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** True for the 8-4-4-4-12 hexadecimal form PostgreSQL accepts as a uuid. */
export const isUuid = (value: string): boolean => UUID.test(value);
