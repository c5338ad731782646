// A stored project this version cannot read (written by a newer one) never locks the user out:
// start-up opens another project, the list shows it as unreadable with the reason, it exports as
// a file byte for byte, and the stored document stays byte-identical.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { expect, openApp, shot, test } from './fixtures.ts';

test('a project from a newer version is listed, exportable and never blocks the others', async ({
  page,
  host,
}) => {
  await openApp(page, host); // creates the store and the demo
  await host.stop();
  const file = join(host.dataDir, 'yardwire.sqlite');
  const newer = JSON.stringify({
    schemaVersion: 9,
    id: 'from-the-future',
    name: 'Lot from a newer version',
    supports: [],
    hologram: { note: 'a field this version does not know' },
  });
  const db = new Database(file);
  db.prepare(
    `INSERT INTO projects (id, name, doc, created_at, updated_at, opened_at)
     VALUES ('from-the-future', 'Lot from a newer version', ?, '2031-01-01T00:00:00.000Z', '2031-01-01T00:00:00.000Z', '2031-01-01T00:00:00.000Z')`,
  ).run(newer);
  db.prepare(
    `INSERT INTO app_state (key, value) VALUES ('lastProjectId', 'from-the-future')
     ON CONFLICT (key) DO UPDATE SET value = excluded.value`,
  ).run();
  db.close();

  await host.restart();
  await openApp(page, host); // the start is not blocked: another project opens
  await page.getByRole('tab', { name: 'Project' }).click();
  await expect(page.getByTestId('project-name')).not.toHaveValue('Lot from a newer version');
  const row = page.getByTestId('project-unreadable');
  await expect(row).toContainText('Lot from a newer version');
  await expect(row).toContainText(/newer Yardwire \(schema 9\)/);
  await shot(page, 'unreadable-project');

  const download = page.waitForEvent('download');
  await row.getByRole('button', { name: 'Export file' }).click();
  const d = await download;
  expect(d.suggestedFilename()).toBe('Lot-from-a-newer-version.yardwire.json');
  expect(readFileSync(await d.path(), 'utf8')).toBe(newer);

  await host.stop();
  const check = new Database(file, { readonly: true });
  const row2 = check.prepare(`SELECT doc FROM projects WHERE id = 'from-the-future'`).get() as {
    doc: string;
  };
  check.close();
  expect(row2.doc).toBe(newer);
});
