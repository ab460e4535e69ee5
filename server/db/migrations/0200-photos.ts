import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

// Photos of blocks (and, later, of chat messages). Files live under UPLOAD_DIR/photos with generated
// names; a row names its two files. Rows removed by a cascade leave files the orphan sweep removes.
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'photos',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        block_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'blocks', key: 'id' }, onDelete: 'CASCADE' },
        // The chat feature adds the foreign key once its table exists.
        chat_message_id: { type: DataTypes.INTEGER, allowNull: true },
        uploaded_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        file_name: { type: DataTypes.STRING(40), allowNull: false, unique: true },
        thumb_file_name: { type: DataTypes.STRING(40), allowNull: false, unique: true },
        mime: { type: DataTypes.STRING(16), allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        thumb_width: { type: DataTypes.INTEGER, allowNull: false },
        thumb_height: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        original_bytes: { type: DataTypes.INTEGER, allowNull: false },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { transaction },
    );
    await queryInterface.addIndex('photos', ['block_id', 'created_at'], { transaction });
    await queryInterface.addIndex('photos', ['chat_message_id'], { transaction });
    await queryInterface.addIndex('photos', ['guild_id'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE photos ADD CONSTRAINT photos_one_owner_check CHECK (num_nonnulls(block_id, chat_message_id) = 1);
       ALTER TABLE photos ADD CONSTRAINT photos_mime_check CHECK (mime IN ('image/jpeg','image/webp'));
       ALTER TABLE photos ADD CONSTRAINT photos_size_check
         CHECK (width > 0 AND height > 0 AND thumb_width > 0 AND thumb_height > 0 AND bytes > 0 AND original_bytes > 0);`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('photos');
};
