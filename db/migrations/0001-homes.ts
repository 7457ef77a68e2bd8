/** Clients, climates, price sets, homes, their leakage tests and their measures. */
import type { Migration } from './index.ts';

export const migration0001: Migration = {
  version: 1,
  name: 'homes',
  sql: `
    CREATE TABLE clients (
      id INTEGER PRIMARY KEY,
      name TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      phone TEXT,
      email TEXT,
      notes TEXT,
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL
    ) STRICT;
    CREATE INDEX clients_by_name ON clients (name);

    CREATE TABLE climates (
      id INTEGER PRIMARY KEY,
      name TEXT NOT NULL UNIQUE CHECK (length(name) BETWEEN 1 AND 200),
      data TEXT NOT NULL CHECK (json_valid(data)),
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL
    ) STRICT;

    CREATE TABLE price_sets (
      id INTEGER PRIMARY KEY,
      name TEXT NOT NULL UNIQUE CHECK (length(name) BETWEEN 1 AND 200),
      data TEXT NOT NULL CHECK (json_valid(data)),
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL
    ) STRICT;

    CREATE TABLE homes (
      id INTEGER PRIMARY KEY,
      client_id INTEGER REFERENCES clients (id) ON DELETE SET NULL,
      climate_id INTEGER REFERENCES climates (id) ON DELETE RESTRICT,
      price_set_id INTEGER REFERENCES price_sets (id) ON DELETE RESTRICT,
      name TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      street TEXT,
      town TEXT,
      region TEXT,
      postal_code TEXT,
      is_demo INTEGER NOT NULL DEFAULT 0 CHECK (is_demo IN (0, 1)),
      notes TEXT,
      data TEXT NOT NULL CHECK (json_valid(data)),
      year_built INTEGER GENERATED ALWAYS AS (json_extract(data, '$.house.yearBuilt')) VIRTUAL,
      floor_area_ft2 REAL GENERATED ALWAYS AS (json_extract(data, '$.house.conditionedFloorAreaFt2')) VIRTUAL,
      volume_ft3 REAL GENERATED ALWAYS AS (json_extract(data, '$.house.conditionedVolumeFt3')) VIRTUAL,
      heating_fuel TEXT GENERATED ALWAYS AS (json_extract(data, '$.heating.fuel')) VIRTUAL,
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL,
      deleted_at TEXT
    ) STRICT;
    CREATE INDEX homes_live ON homes (deleted_at, name);
    CREATE INDEX homes_by_client ON homes (client_id);

    CREATE TABLE leakage_tests (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      position INTEGER NOT NULL,
      kind TEXT NOT NULL CHECK (kind IN ('testIn', 'testOut')),
      tested_on TEXT CHECK (tested_on IS NULL OR tested_on GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'),
      cfm50 REAL CHECK (cfm50 IS NULL OR cfm50 > 0),
      exponent_n REAL CHECK (exponent_n IS NULL OR exponent_n BETWEEN 0.3 AND 1.2),
      note TEXT,
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL,
      UNIQUE (home_id, position)
    ) STRICT;

    CREATE TABLE leakage_test_points (
      test_id INTEGER NOT NULL REFERENCES leakage_tests (id) ON DELETE CASCADE,
      position INTEGER NOT NULL,
      pressure_pa REAL NOT NULL CHECK (pressure_pa > 0),
      flow_cfm REAL NOT NULL CHECK (flow_cfm > 0),
      PRIMARY KEY (test_id, position)
    ) STRICT;

    CREATE TABLE measures (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      position INTEGER NOT NULL,
      key TEXT NOT NULL CHECK (length(key) BETWEEN 1 AND 64),
      type_id TEXT NOT NULL,
      location TEXT CHECK (location IS NULL OR location IN ('ceiling', 'wall', 'floor', 'flue')),
      estimate TEXT NOT NULL CHECK (json_valid(estimate)),
      quantity REAL GENERATED ALWAYS AS (json_extract(estimate, '$.byUnits.units')) VIRTUAL,
      materials_usd REAL NOT NULL CHECK (materials_usd >= 0),
      labor_hours REAL NOT NULL CHECK (labor_hours >= 0),
      labor_rate_usd_per_hour REAL NOT NULL CHECK (labor_rate_usd_per_hour >= 0),
      markup_fraction REAL CHECK (markup_fraction IS NULL OR markup_fraction >= 0),
      health_and_safety INTEGER NOT NULL DEFAULT 0 CHECK (health_and_safety IN (0, 1)),
      life_years INTEGER CHECK (life_years IS NULL OR life_years BETWEEN 1 AND 100),
      status TEXT NOT NULL DEFAULT 'planned' CHECK (status IN ('planned', 'done', 'declined')),
      note TEXT,
      created_at TEXT NOT NULL,
      updated_at TEXT NOT NULL,
      UNIQUE (home_id, key),
      UNIQUE (home_id, position)
    ) STRICT;
    CREATE INDEX measures_by_type ON measures (type_id);
  `,
};
