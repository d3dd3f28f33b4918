// The 403 page: shown, with status 403, when a role opens a page the role table
// does not give it.
import { StatusPage } from '@/components/ui/status-page';

export default function Forbidden() {
  return (
    <StatusPage code="403" codeClass="text-fault" title="This page is not open to your role" testId="forbidden-page">
      Your account can sign in, but its role does not include this page. Ask your shop&apos;s admin if you need it.
    </StatusPage>
  );
}
