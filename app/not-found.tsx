// The 404 page: a missing page or a record of another shop look the same.
import { StatusPage } from '@/components/ui/status-page';

export default function NotFound() {
  return (
    <StatusPage code="404" codeClass="text-ink-soft" title="Nothing here">
      The page or record does not exist, or it belongs to another shop.
    </StatusPage>
  );
}
