import type { Migration } from '../migrator';

// Photo files are removed only where the database recorded that they should be:
// - photo_uploads_pending: names recorded (and committed) before their files are written, cleared in
//   the transaction that inserts the photo rows. A name left here past the grace period belongs to an
//   upload that never committed, so its files may go.
// - photo_file_deletions: filled by a trigger in the same transaction as any photo row's deletion,
//   cascades from a block, chat message or guild included; a job removes the files and the entries.
// - install_identity: one row naming this install, written on first start (not here, so databases
//   cloned from one migrated template still get identities of their own) and stamped on the photo store.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `CREATE TABLE photo_uploads_pending (
         file_name varchar(40) PRIMARY KEY,
         created_at timestamptz NOT NULL DEFAULT now()
       );
       CREATE INDEX photo_uploads_pending_created_at ON photo_uploads_pending (created_at);
       CREATE TABLE photo_file_deletions (
         file_name varchar(40) PRIMARY KEY,
         queued_at timestamptz NOT NULL DEFAULT now()
       );
       CREATE TABLE install_identity (
         id smallint PRIMARY KEY DEFAULT 1 CHECK (id = 1),
         install_id uuid NOT NULL,
         created_at timestamptz NOT NULL DEFAULT now()
       );
       CREATE FUNCTION photos_queue_file_deletion() RETURNS trigger LANGUAGE plpgsql AS $$
       BEGIN
         INSERT INTO photo_file_deletions (file_name)
           VALUES (OLD.file_name), (OLD.thumb_file_name)
           ON CONFLICT (file_name) DO NOTHING;
         RETURN OLD;
       END $$;
       CREATE TRIGGER photos_queue_file_deletion AFTER DELETE ON photos
         FOR EACH ROW EXECUTE FUNCTION photos_queue_file_deletion();`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(
    `DROP TRIGGER IF EXISTS photos_queue_file_deletion ON photos;
     DROP FUNCTION IF EXISTS photos_queue_file_deletion();
     DROP TABLE IF EXISTS install_identity;
     DROP TABLE IF EXISTS photo_file_deletions;
     DROP TABLE IF EXISTS photo_uploads_pending;`,
  );
};
