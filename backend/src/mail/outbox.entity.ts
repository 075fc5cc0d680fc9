import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  OneToMany,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';

/** A message the local SMTP fake received (the embedded default when no real SMTP server is set). */
@Entity({ name: 'outbox_messages' })
export class OutboxMessage {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'message_id', type: 'varchar', length: 500, default: '' })
  messageId: string;

  @Column({ name: 'from_address', type: 'text' })
  from: string;

  @Column({ name: 'to_address', type: 'text' })
  to: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text', default: '' })
  text: string;

  @OneToMany(() => OutboxAttachment, (a) => a.message)
  attachments: Relation<OutboxAttachment>[];

  @CreateDateColumn({ name: 'received_at', type: 'timestamptz' })
  receivedAt: Date;
}

@Entity({ name: 'outbox_attachments' })
export class OutboxAttachment {
  @PrimaryGeneratedColumn()
  id: number;

  @ManyToOne(() => OutboxMessage, (m) => m.attachments, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'message_id' })
  message: Relation<OutboxMessage>;

  @Column({ type: 'varchar', length: 255 })
  filename: string;

  @Column({ name: 'content_type', type: 'varchar', length: 120 })
  contentType: string;

  @Column({ type: 'integer' })
  size: number;

  @Column({ type: 'bytea', select: false })
  content: Buffer;
}
