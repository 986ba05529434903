/** The largest value of a PostgreSQL integer column (revision numbers, draft versions): larger ones are a 400, not a database error. */
export const MAX_INT4 = 2_147_483_647;
