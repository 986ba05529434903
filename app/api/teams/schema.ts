import { z } from 'zod';
import { safeText } from '@/lib/engine/text';

export const createTeamSchema = z.strictObject({
  name: safeText().trim().min(1, 'enter a team name').max(120, 'use at most 120 characters'),
});

export const currentTeamSchema = z.strictObject({ teamId: z.string().uuid('must be a team id') });
