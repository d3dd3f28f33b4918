// The root address sends a signed-in user to the first page their role may see.
import { redirect } from 'next/navigation';
import { currentUser } from '@/lib/auth/require-role';
import { homeFor } from '@/lib/auth/roles';

export default async function Home() {
  const user = await currentUser();
  redirect(user ? homeFor(user.role) : '/sign-in');
}
