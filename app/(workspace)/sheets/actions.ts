'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { createSheet } from '@/lib/db/sheets';
import { AppError } from '@/lib/errors';
import { titleSchema } from '@/app/api/sheets/schema';
import { safeText } from '@/lib/engine/text';

const createSheetFormSchema = z.object({
  title: titleSchema,
  siteName: safeText().trim().max(200, 'use at most 200 characters').optional(),
});

export type CreateSheetState = { errors?: { title?: string; siteName?: string; form?: string } };

export async function createSheetAction(_previous: CreateSheetState, formData: FormData): Promise<CreateSheetState> {
  const parsed = createSheetFormSchema.safeParse({
    title: formData.get('title') ?? '',
    siteName: formData.get('siteName') || undefined,
  });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue?.path[0] === 'siteName' ? 'siteName' : 'title';
    return { errors: { [field]: issue?.message ?? 'Check this field.' } };
  }
  let sheetId: string;
  try {
    const user = await requireUser();
    const { teamId } = await resolveTeam({ userId: user.id, action: 'edit' });
    const site = parsed.data.siteName ? { name: parsed.data.siteName } : undefined;
    sheetId = (await createSheet({ teamId, userId: user.id, title: parsed.data.title, site })).id;
  } catch (error) {
    if (error instanceof AppError) return { errors: { form: error.message } };
    throw error;
  }
  revalidatePath('/sheets');
  redirect(`/sheets/${sheetId}`);
}
