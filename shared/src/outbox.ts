/*
 * Messages the local SMTP fake received, as the API and the client exchange them.
 */

export interface OutboxAttachmentView {
  id: number;
  filename: string;
  contentType: string;
  /** Bytes. */
  size: number;
}

/** A message the local SMTP fake received. */
export interface OutboxMessageView {
  id: number;
  from: string;
  to: string;
  subject: string;
  text: string;
  receivedAt: string;
  attachments: OutboxAttachmentView[];
}
