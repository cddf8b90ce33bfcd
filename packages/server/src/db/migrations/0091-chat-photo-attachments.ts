import type { MigrationFn } from '../migrator';

/**
 * Chat photos go through the photo pipeline beside animals', farms' and chores'. A chat photo belongs to a
 * thread from its upload (who may see it follows who reads the thread) and to its message once sent; until
 * then only its uploader sees it. An admin without a farm may share one, so the farm is optional for chat photos.
 */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    ALTER TABLE photos ADD COLUMN chat_thread_id uuid REFERENCES chat_threads(id);
    ALTER TABLE photos ADD COLUMN chat_message_id uuid REFERENCES chat_messages(id);
    ALTER TABLE photos ALTER COLUMN farm_id DROP NOT NULL;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_shape;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_check;
    ALTER TABLE photos ADD CONSTRAINT photos_subject_check CHECK (subject IN ('animal', 'farm', 'chore', 'chat'));
    ALTER TABLE photos ADD CONSTRAINT photos_subject_shape CHECK (
      ((subject = 'animal') = (animal_id IS NOT NULL)) AND ((subject = 'chore') = (chore_entry_id IS NOT NULL))
      AND ((subject = 'chat') = (chat_thread_id IS NOT NULL)) AND (subject = 'chat' OR farm_id IS NOT NULL)
      AND (chat_message_id IS NULL OR subject = 'chat'));
    CREATE INDEX photos_chat_message_idx ON photos (chat_message_id) WHERE chat_message_id IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DELETE FROM photos WHERE subject = 'chat';
    DROP INDEX IF EXISTS photos_chat_message_idx;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_shape;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_check;
    ALTER TABLE photos ADD CONSTRAINT photos_subject_check CHECK (subject IN ('animal', 'farm', 'chore'));
    ALTER TABLE photos ADD CONSTRAINT photos_subject_shape CHECK (
      ((subject = 'animal') = (animal_id IS NOT NULL)) AND ((subject = 'chore') = (chore_entry_id IS NOT NULL)));
    ALTER TABLE photos ALTER COLUMN farm_id SET NOT NULL;
    ALTER TABLE photos DROP COLUMN chat_message_id;
    ALTER TABLE photos DROP COLUMN chat_thread_id;
  `);
};
