/**
 * Numbered schema migrations of the project store, from version 1. The database's
 * `PRAGMA user_version` holds the number of the last migration applied. Each migration runs in
 * one transaction together with the version bump, so a crash leaves either the old or the new
 * schema, and re-running is safe (applied migrations are skipped).
 */
export interface Migration {
  version: number;
  description: string;
  sql: string;
}

export const MIGRATIONS: readonly Migration[] = [
  {
    version: 1,
    description: 'projects, image overlays and application state',
    sql: `
      CREATE TABLE projects (
        id TEXT PRIMARY KEY,
        name TEXT NOT NULL,
        doc TEXT NOT NULL,
        created_at TEXT NOT NULL,
        updated_at TEXT NOT NULL,
        opened_at TEXT
      );
      CREATE INDEX projects_opened ON projects (opened_at DESC);
      CREATE TABLE overlays (
        project_id TEXT PRIMARY KEY REFERENCES projects (id) ON DELETE CASCADE,
        name TEXT NOT NULL,
        bounds TEXT NOT NULL,
        png_data_url TEXT NOT NULL,
        updated_at TEXT NOT NULL
      );
      CREATE TABLE app_state (
        key TEXT PRIMARY KEY,
        value TEXT NOT NULL
      );
    `,
  },
  {
    version: 2,
    description: "each project's last plan: its inputs' hash, the plan itself and what the views showed",
    sql: `
      CREATE TABLE plans (
        project_id TEXT PRIMARY KEY REFERENCES projects (id) ON DELETE CASCADE,
        inputs_hash TEXT NOT NULL,
        doc TEXT NOT NULL,
        selected_id TEXT,
        compare_id TEXT,
        updated_at TEXT NOT NULL
      );
    `,
  },
  {
    version: 3,
    description: 'overlays keep a reference to the image file and its georeference; the PNG becomes optional',
    sql: `
      CREATE TABLE overlays_v3 (
        project_id TEXT PRIMARY KEY REFERENCES projects (id) ON DELETE CASCADE,
        name TEXT NOT NULL,
        bounds TEXT NOT NULL,
        png_data_url TEXT,
        source TEXT,
        updated_at TEXT NOT NULL,
        CHECK (png_data_url IS NOT NULL OR source IS NOT NULL)
      );
      INSERT INTO overlays_v3 (project_id, name, bounds, png_data_url, source, updated_at)
        SELECT project_id, name, bounds, png_data_url, NULL, updated_at FROM overlays;
      DROP TABLE overlays;
      ALTER TABLE overlays_v3 RENAME TO overlays;
    `,
  },
];

export const LATEST_STORE_VERSION = MIGRATIONS.reduce((v, m) => Math.max(v, m.version), 0);
