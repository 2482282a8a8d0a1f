'use server';
import { headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { APIError } from 'better-auth/api';
import { z } from 'zod';
import { getAuth } from '@/lib/auth';
import { userAction } from '@/lib/action';
import { ensureWorkspaceSettings } from '@/db/queries/workspaces';

const createWorkspaceSchema = z.object({
  name: z.string().trim().min(2, 'Use at least 2 characters.').max(80),
  slug: z
    .string()
    .trim()
    .toLowerCase()
    .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Lower-case letters, digits and single hyphens only.')
    .min(2)
    .max(48),
});

export const createWorkspace = userAction(createWorkspaceSchema, async (input) => {
  let slug: string;
  try {
    const created = await getAuth().api.createOrganization({ body: { name: input.name, slug: input.slug }, headers: await headers() });
    await ensureWorkspaceSettings(created.id);
    slug = created.slug;
  } catch (e) {
    if (e instanceof APIError) {
      const taken = /slug|exists/i.test(e.message);
      return {
        ok: false,
        code: 'conflict',
        message: taken ? 'That address is taken; choose another.' : e.message,
        fieldErrors: taken ? { slug: ['Already in use.'] } : undefined,
      };
    }
    throw e;
  }
  redirect(`/w/${slug}`);
});
