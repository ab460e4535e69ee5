import type { Migration } from '../migrator';

// Photos of a chat message go with it (the photos table leaves this key to the chat feature).
export const up: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.sequelize.query(
    `ALTER TABLE photos ADD CONSTRAINT photos_chat_message_fk
       FOREIGN KEY (chat_message_id) REFERENCES chat_messages(id) ON DELETE CASCADE;`,
  );
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.sequelize.query('ALTER TABLE photos DROP CONSTRAINT IF EXISTS photos_chat_message_fk;');
};
