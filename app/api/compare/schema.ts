import { z } from 'zod';

const side = z
  .string({ message: 'write it as {sheetId}:{revision}' })
  .regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}:[1-9][0-9]{0,8}$/i, 'write it as {sheetId}:{revision}, e.g. 0d3a…:2')
  .transform((value) => {
    // The pattern above guarantees exactly one colon.
    const colon = value.indexOf(':');
    return { sheetId: value.slice(0, colon).toLowerCase(), number: Number(value.slice(colon + 1)) };
  });

export const compareQuerySchema = z.strictObject({ from: side, to: side });
