// A machine's versions, newest first: when each was saved, what changed from the one
// before (in the shop's units), and its full profile on request. Estimates name the
// version they were made with, so each stays readable as it was.
import { changeText } from '@/lib/machines/change-text';
import { profileChanges } from '@/lib/machines/profile-diff';
import type { LengthUnit } from '@/lib/units/length';
import type { MachineProfile } from '@/lib/validation/machine-profile';
import { ProfileView } from './profile-view';

export interface VersionRow {
  version: number;
  createdAt: Date;
  profile: MachineProfile;
}

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

export function VersionsTable({ versions, current, unit }: { versions: VersionRow[]; current: number; unit: LengthUnit }) {
  if (versions.length === 0) {
    return <p className="text-ink-soft">No version has been stored yet: the first is written with the first estimate or the first change.</p>;
  }
  return (
    <div className="overflow-x-auto rounded-md border-2 border-rule bg-panel">
      <table className="w-full border-collapse text-left" aria-label="Profile versions">
        <thead className="bg-night text-white">
          <tr>
            <th scope="col" className="px-4 py-3 text-right font-bold">Version</th>
            <th scope="col" className="px-4 py-3 font-bold">Saved (UTC)</th>
            <th scope="col" className="px-4 py-3 font-bold">What changed</th>
          </tr>
        </thead>
        <tbody>
          {versions.map((v, i) => {
            const before = versions[i + 1];
            const changes = before && before.version === v.version - 1 ? profileChanges(before.profile, v.profile) : null;
            return (
              <tr key={v.version} className="border-t border-rule-light align-top even:bg-ground" data-version={v.version}>
                <td className="figure px-4 py-3 text-right">
                  v{v.version}
                  {v.version === current ? <span className="block font-sans text-sm font-bold text-ok">current</span> : null}
                </td>
                <td className="figure px-4 py-3">{when.format(v.createdAt)}</td>
                <td className="px-4 py-3">
                  {changes === null ? (
                    <p>{v.version === 1 ? 'First version.' : 'The version before is not stored, so the changes are not known.'}</p>
                  ) : changes.length === 0 ? (
                    <p>Same profile as v{before.version}.</p>
                  ) : (
                    <ul className="list-disc pl-5">
                      {changes.map((c) => (
                        <li key={JSON.stringify(c)}>{changeText(c, unit)}</li>
                      ))}
                    </ul>
                  )}
                  <details className="mt-2">
                    <summary className="cursor-pointer font-bold text-spruce underline underline-offset-4">Profile of v{v.version}</summary>
                    <div className="mt-2">
                      <ProfileView profile={v.profile} unit={unit} />
                    </div>
                  </details>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
