-- When each device last reached the server (set at most once a minute per device), for the admins' device list.
ALTER TABLE devices ADD COLUMN last_seen_at timestamptz;
