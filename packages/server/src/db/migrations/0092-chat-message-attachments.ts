import type { MigrationFn } from '../migrator';

/**
 * A message carries its photos (id and size, in the order sent) so a page of messages reads them without a
 * join; a message of photos alone needs no text.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE chat_messages ADD COLUMN attachments jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(attachments) = 'array' AND jsonb_array_length(attachments) <= 4);
    -- The unnamed check of 0090-chat: a live message says something.
    ALTER TABLE chat_messages DROP CONSTRAINT chat_messages_check;
    ALTER TABLE chat_messages ADD CONSTRAINT chat_messages_says_something
      CHECK (deleted_at IS NOT NULL OR length(body) >= 1 OR jsonb_array_length(attachments) > 0);
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE chat_messages DROP CONSTRAINT chat_messages_says_something;
    UPDATE chat_messages SET body = '(photo)' WHERE deleted_at IS NULL AND length(body) = 0;
    ALTER TABLE chat_messages ADD CONSTRAINT chat_messages_check CHECK (deleted_at IS NOT NULL OR length(body) >= 1);
    ALTER TABLE chat_messages DROP COLUMN attachments;
  `);
};
