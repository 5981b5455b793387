import { Column, Entity, PrimaryColumn } from 'typeorm';

/** The bytes of a packing slip, base64, kept apart from its row so listing slips never loads them. */
@Entity('attachment_content')
export class AttachmentContentEntity {
  @PrimaryColumn({ name: 'attachment_id', type: 'integer' })
  attachmentId: number;

  @Column({ name: 'content_base64', type: 'text' })
  contentBase64: string;
}
