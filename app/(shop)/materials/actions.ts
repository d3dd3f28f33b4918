'use server';
// Server actions of the materials pages: add, change and remove a sheet material. Each
// starts with the same guard as the route handlers; lengths arrive in mm and the cost in
// minor units (the form converts).
import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { createMaterial, deleteMaterial, updateMaterial } from '@/db/queries/materials';
import { requireAction } from '@/lib/auth/require-role';
import { runAction, type ActionState } from '@/lib/http/action-state';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { materialInputSchema } from '@/lib/validation/materials';

export async function createMaterialAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return runAction(async () => {
    const user = await requireAction('materials:write');
    const input = parseOrThrow(materialInputSchema, formDataToObject(form), 'material');
    const material = await createMaterial(user.shopId, input);
    revalidatePath('/materials');
    return `${material.name} added.`;
  });
}

export async function updateMaterialAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let done = false;
  const state = await runAction(async () => {
    const user = await requireAction('materials:write');
    const flat = formDataToObject(form);
    const materialId = parseId(String(flat.materialId ?? ''), 'material');
    const { materialId: _id, ...rest } = flat;
    void _id;
    const input = parseOrThrow(materialInputSchema, rest, 'material');
    const material = await updateMaterial(user.shopId, materialId, input);
    revalidatePath('/materials');
    done = true;
    return `${material.name} saved.`;
  });
  if (done) redirect('/materials?saved=1');
  return state;
}

export async function deleteMaterialAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  let done = false;
  const state = await runAction(async () => {
    const user = await requireAction('materials:write');
    const materialId = parseId(String(form.get('materialId') ?? ''), 'material');
    await deleteMaterial(user.shopId, materialId);
    revalidatePath('/materials');
    done = true;
    return 'Material removed.';
  });
  if (done) redirect('/materials?removed=1');
  return state;
}
