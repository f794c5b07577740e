-- The Socket.IO Postgres adapter sends packets too large for NOTIFY through this table
-- (@socket.io/postgres-adapter, option tableName; default "socket_io_attachments").
CREATE TABLE IF NOT EXISTS socket_io_attachments (
  id bigserial PRIMARY KEY,
  created_at timestamptz DEFAULT now(),
  payload bytea
);
