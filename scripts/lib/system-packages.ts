import fs from 'node:fs';
import { isRoot, runVisible } from './run-command';

/** A Debian package the project needs, and the file whose presence shows it is installed. */
interface SystemPackage {
  readonly debianPackage: string;
  readonly installedFile: string;
  readonly purpose: string;
}

export const POSTGRES_BIN_DIR = process.env.PG_BIN ?? '/usr/lib/postgresql/15/bin';

const POSTGRES: SystemPackage = { debianPackage: 'postgresql-15', installedFile: `${POSTGRES_BIN_DIR}/initdb`, purpose: 'the database server' };
const POSTGIS: SystemPackage = {
  debianPackage: 'postgresql-15-postgis-3',
  installedFile: '/usr/share/postgresql/15/extension/postgis.control',
  purpose: 'spatial types for the network map',
};
const CHROMIUM: SystemPackage = { debianPackage: 'chromium', installedFile: '/usr/bin/chromium', purpose: 'the browser journeys' };

export class MissingSystemPackages extends Error {}

/**
 * Makes sure the Debian packages are present. As root the missing ones are installed with apt;
 * otherwise this says exactly what to install and fails, rather than half-starting.
 */
export async function ensureSystemPackages({ forTests }: { forTests: boolean }): Promise<void> {
  const needed = forTests ? [POSTGRES, POSTGIS, CHROMIUM] : [POSTGRES, POSTGIS];
  const missing = needed.filter((pkg) => !fs.existsSync(pkg.installedFile));
  if (missing.length === 0) return;
  const names = missing.map((pkg) => pkg.debianPackage);
  const list = missing.map((pkg) => `  ${pkg.debianPackage} (${pkg.purpose})`).join('\n');
  if (!isRoot()) {
    throw new MissingSystemPackages(`Spanledger needs these Debian packages:\n${list}\nInstall them with:\n  sudo apt-get install -y ${names.join(' ')}`);
  }
  console.log(`Installing system packages: ${names.join(', ')}`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if ((await runVisible('apt-get', ['update', '-qq'], { env })) !== 0) throw new MissingSystemPackages('apt-get update failed');
  if ((await runVisible('apt-get', ['install', '-y', '-qq', ...names], { env })) !== 0) {
    throw new MissingSystemPackages(`apt-get install ${names.join(' ')} failed`);
  }
  const stillMissing = missing.filter((pkg) => !fs.existsSync(pkg.installedFile));
  if (stillMissing.length > 0) {
    throw new MissingSystemPackages(`Installed, but still missing: ${stillMissing.map((pkg) => pkg.installedFile).join(', ')}`);
  }
}
