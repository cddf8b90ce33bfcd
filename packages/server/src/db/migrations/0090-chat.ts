import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Co-op Chat. A thread is the co-op's channel, a topic a member started, or the thread of a subject
 * another module registers (a litter, a processing day, a loan): who reads it follows who reads the
 * subject. Messages carry a per-co-op sequence for keyset paging and "what did I miss since", the
 * author's client id as the idempotency key of a send, and a generated tsvector for search.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE chat_threads (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      kind text NOT NULL CHECK (kind IN ('channel', 'topic', 'subject')),
      subject_type text CHECK (subject_type ~ '^[a-z][a-z-]{1,39}$'),
      subject_id uuid,
      title text NOT NULL CHECK (length(title) BETWEEN 1 AND 200),
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      last_message_at timestamptz,
      last_seq bigint NOT NULL DEFAULT 0,
      CHECK ((kind = 'subject') = (subject_type IS NOT NULL AND subject_id IS NOT NULL))
    );
    CREATE UNIQUE INDEX chat_threads_one_channel ON chat_threads (coop_id) WHERE kind = 'channel';
    CREATE UNIQUE INDEX chat_threads_one_per_subject ON chat_threads (coop_id, subject_type, subject_id) WHERE kind = 'subject';
    CREATE INDEX chat_threads_recent ON chat_threads (coop_id, last_message_at DESC NULLS LAST);
    ${tenantIsolation('chat_threads')}
    GRANT SELECT, INSERT, UPDATE ON chat_threads TO ${appRole};

    CREATE SEQUENCE chat_message_seq AS bigint;
    CREATE TABLE chat_messages (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      thread_id uuid NOT NULL REFERENCES chat_threads(id),
      seq bigint NOT NULL DEFAULT nextval('chat_message_seq'),
      author_id uuid NOT NULL REFERENCES users(id),
      author_farm_id uuid REFERENCES farms(id),
      client_id uuid NOT NULL,
      body text NOT NULL CHECK (length(body) <= 4000),
      reply_to_id uuid REFERENCES chat_messages(id),
      mentions uuid[] NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      edited_at timestamptz,
      deleted_at timestamptz,
      hidden_at timestamptz,
      hidden_by uuid REFERENCES users(id),
      hidden_reason text CHECK (length(hidden_reason) <= 500),
      search tsvector GENERATED ALWAYS AS (to_tsvector('english', body)) STORED,
      CHECK (deleted_at IS NOT NULL OR length(body) >= 1),
      CHECK ((hidden_at IS NULL) = (hidden_reason IS NULL))
    );
    CREATE UNIQUE INDEX chat_messages_once_per_client_id ON chat_messages (coop_id, author_id, client_id);
    CREATE UNIQUE INDEX chat_messages_thread_order ON chat_messages (thread_id, seq);
    CREATE INDEX chat_messages_rate ON chat_messages (author_id, created_at DESC);
    CREATE INDEX chat_messages_search ON chat_messages USING gin (search);
    ${tenantIsolation('chat_messages')}
    GRANT SELECT, INSERT, UPDATE ON chat_messages TO ${appRole};
    GRANT USAGE ON SEQUENCE chat_message_seq TO ${appRole};

    CREATE TABLE chat_reactions (
      message_id uuid NOT NULL REFERENCES chat_messages(id),
      user_id uuid NOT NULL REFERENCES users(id),
      reaction text NOT NULL CHECK (reaction IN ('thumbs-up', 'heart', 'laugh', 'wow', 'thanks', 'check')),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (message_id, user_id, reaction)
    );
    ${tenantIsolation('chat_reactions')}
    GRANT SELECT, INSERT, DELETE ON chat_reactions TO ${appRole};

    CREATE TABLE chat_read_positions (
      thread_id uuid NOT NULL REFERENCES chat_threads(id),
      user_id uuid NOT NULL REFERENCES users(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      read_seq bigint NOT NULL DEFAULT 0,
      updated_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, thread_id)
    );
    ${tenantIsolation('chat_read_positions')}
    GRANT SELECT, INSERT, UPDATE ON chat_read_positions TO ${appRole};

    CREATE TABLE chat_mutes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      user_id uuid NOT NULL REFERENCES users(id),
      muted_by uuid NOT NULL REFERENCES users(id),
      until timestamptz NOT NULL,
      reason text NOT NULL CHECK (length(reason) BETWEEN 1 AND 500),
      lifted_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX chat_mutes_current ON chat_mutes (user_id, until DESC) WHERE lifted_at IS NULL;
    ${tenantIsolation('chat_mutes')}
    GRANT SELECT, INSERT, UPDATE ON chat_mutes TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TABLE IF EXISTS chat_mutes; DROP TABLE IF EXISTS chat_read_positions; DROP TABLE IF EXISTS chat_reactions;
    DROP TABLE IF EXISTS chat_messages; DROP SEQUENCE IF EXISTS chat_message_seq; DROP TABLE IF EXISTS chat_threads;
  `);
};
