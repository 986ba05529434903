import { z } from 'zod';
import { safeText } from '@/lib/engine/text';

export const blockNameSchema = z.strictObject({ name: safeText().max(100, 'at most 100 characters') });
