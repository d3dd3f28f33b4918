// Preview: a signed-in user opens a local program file in the 3D viewer with a machine, sheet,
// Z zero and hold-down of their choosing. The file never leaves the browser; the page only
// reads the shop's machines and materials to offer them.
import type { Metadata } from 'next';
import { PreviewWorkbench } from '@/components/preview/preview-workbench';
import { PageHeader } from '@/components/ui/page-header';
import { previewChoices } from '@/db/queries/preview';
import { guardPage } from '@/lib/auth/page-guard';

export const metadata: Metadata = { title: 'Preview' };

export default async function PreviewPage() {
  const user = await guardPage('preview');
  const { machines, sheets } = await previewChoices(user.shopId);
  return (
    <>
      <PageHeader title="Preview a program" lead="See a program’s path over the sheet, play it on the estimated clock and read its findings, without uploading it." />
      <PreviewWorkbench machines={machines} sheets={sheets} />
    </>
  );
}
