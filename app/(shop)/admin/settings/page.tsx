// Admin page: the shop's quote, price, hold-down labour and calibration settings (every
// column of shop_settings), edited in one form.
import type { Metadata } from 'next';
import { ShopSettingsForm } from '@/components/settings/shop-settings-form';
import { PageHeader } from '@/components/ui/page-header';
import { getShopSettings } from '@/db/queries/shop-settings';
import { getShopSettings as getShop } from '@/db/queries/shops';
import { guardPage } from '@/lib/auth/page-guard';

export const metadata: Metadata = { title: 'Settings' };

export default async function SettingsPage() {
  const admin = await guardPage('settings');
  const [settings, shop] = await Promise.all([getShopSettings(admin.shopId), getShop(admin.shopId)]);
  return (
    <>
      <PageHeader title="Settings" lead="What quotes print and how they are priced, the hand work each hold-down method costs, and how calibration suggests a machine’s time factor." />
      <ShopSettingsForm initial={settings} currency={shop.currency} />
    </>
  );
}
