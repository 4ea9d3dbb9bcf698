-- Teams, devices, one-time enrolment codes, records (as pushed, sealed fields opaque), conflicts.
CREATE TABLE teams (
  id text PRIMARY KEY,
  name text NOT NULL,
  created_at timestamptz NOT NULL DEFAULT now(),
  -- The per-team change counter. A push locks this row first (SELECT ... FOR UPDATE), so pushers of
  -- one team are serialised and change numbers are handed out in commit order.
  change_seq bigint NOT NULL DEFAULT 0
);

CREATE TABLE devices (
  id text PRIMARY KEY,
  team_id text NOT NULL REFERENCES teams(id),
  role text NOT NULL CHECK (role IN ('clinician', 'auditor', 'admin')),
  label text NOT NULL,
  token_hash text NOT NULL UNIQUE,
  created_at timestamptz NOT NULL DEFAULT now(),
  revoked_at timestamptz
);
CREATE INDEX devices_team ON devices (team_id);

CREATE TABLE enrolment_codes (
  code_hash text PRIMARY KEY,
  team_id text NOT NULL REFERENCES teams(id),
  role text NOT NULL CHECK (role IN ('clinician', 'auditor', 'admin')),
  -- The team key wrapped under a key derived from the half of the code the server never sees; null
  -- for auditors and for the first admin (whose device creates the team key).
  key_envelope text,
  expires_at timestamptz NOT NULL,
  used_at timestamptz,
  created_by text
);

CREATE TABLE records (
  team_id text NOT NULL REFERENCES teams(id),
  tbl text NOT NULL,
  id text NOT NULL,
  updated_at text NOT NULL,
  deleted boolean NOT NULL,
  seq bigint NOT NULL,
  device_id text NOT NULL,
  -- Canonical JSON of the record as pushed: protected fields only as AES-GCM ciphertext.
  body text NOT NULL,
  PRIMARY KEY (team_id, tbl, id)
);
CREATE UNIQUE INDEX records_team_seq ON records (team_id, seq);

CREATE TABLE conflicts (
  team_id text NOT NULL REFERENCES teams(id),
  seq bigserial PRIMARY KEY,
  tbl text NOT NULL,
  record_id text NOT NULL,
  kept_updated_at text NOT NULL,
  lost_updated_at text NOT NULL,
  lost_hash text NOT NULL,
  winner text NOT NULL CHECK (winner IN ('incoming', 'stored')),
  reason text NOT NULL CHECK (reason IN ('newer', 'tie-break')),
  device_id text NOT NULL,
  at timestamptz NOT NULL DEFAULT now(),
  UNIQUE (team_id, tbl, record_id, kept_updated_at, lost_hash)
);
CREATE INDEX conflicts_team ON conflicts (team_id, seq);
