import { DataTypes, type QueryInterface } from 'sequelize'
import { allowedValuesTrigger } from '../triggers.ts'

/** E-mail waiting to leave, and what became of it: written in the transaction of the action that causes it. */
export async function up(q: QueryInterface): Promise<void> {
  await q.createTable('mail_outbox', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    template: { type: DataTypes.STRING(60), allowNull: false },
    recipient: { type: DataTypes.STRING(254), allowNull: false },
    subject: { type: DataTypes.STRING(300), allowNull: false },
    // Emptied once the message is sent or given up: invitation and reset links are secrets.
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING(10), allowNull: false },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE, allowNull: true },
    claimedBy: { type: DataTypes.STRING(100), allowNull: true },
    claimedAt: { type: DataTypes.DATE, allowNull: true },
    lastError: { type: DataTypes.STRING(300), allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    sentAt: { type: DataTypes.DATE, allowNull: true },
  })
  await q.addIndex('mail_outbox', ['status', 'nextAttemptAt'])
  await q.addIndex('mail_outbox', ['createdAt'])
  await allowedValuesTrigger(q, {
    name: 'mail_outbox_status',
    table: 'mail_outbox',
    column: 'status',
    values: ['queued'],
    message: 'a message enters the outbox queued',
  })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('mail_outbox')
}
