import { z } from 'zod';
import { TEAM_ROLES } from '@/models';

export const roleSchema = z.enum(TEAM_ROLES, { message: 'choose owner, editor, reviewer or viewer' });

export const updateMemberSchema = z.strictObject({ role: roleSchema });

export const teamIdSchema = z.string().uuid('must be a team id');
