import { readFile } from 'node:fs/promises';
import { basename, resolve, sep } from 'node:path';
import {
  RECEIVABLE_STATUSES,
  type AttachmentType,
  type DockAttachment,
  type DockStatus,
} from '../../shared/schemas/dock';
import { recordAudit } from '../audit/audit.service';
import { bumpDockVersion } from '../settings/versions';
import { toDockAttachment } from './dock.service';
import { ConflictError, NotFoundError, UnsupportedTypeError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { ReleaseEntity } from '../releases/release.entity';
import { AttachmentEntity } from './attachment.entity';
import { AttachmentContentEntity } from './attachment-content.entity';
import type { Database } from '../db/database';

const EXTENSIONS: Record<AttachmentType, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'application/pdf': 'pdf',
};

const startsWith = (buffer: Buffer, bytes: number[], offset = 0) =>
  buffer.length >= offset + bytes.length && bytes.every((byte, index) => buffer[offset + index] === byte);
const ascii = (text: string) => [...text].map((character) => character.charCodeAt(0));

/**
 * The type of a file by its signature ("magic number"), never by its name or the browser's word
 * for it. Signatures (from memory): JPEG starts with the SOI marker FF D8 followed by another
 * marker's FF (ITU-T T.81 | ISO/IEC 10918-1, annex B); PNG with the eight bytes 89 'PNG' CR LF
 * 1A LF (PNG specification, ISO/IEC 15948, "PNG signature"); WebP with 'RIFF', a 4-byte size,
 * then 'WEBP' (RFC 9649, the RIFF header); PDF with '%PDF-' (ISO 32000-1, 7.5.2 "File header").
 */
export function sniffAttachmentType(buffer: Buffer): AttachmentType | null {
  if (startsWith(buffer, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(buffer, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (startsWith(buffer, ascii('RIFF')) && startsWith(buffer, ascii('WEBP'), 8)) return 'image/webp';
  if (startsWith(buffer, ascii('%PDF-'))) return 'application/pdf';
  return null;
}

/** The name a person gave the file, without any folder and without control characters. */
function cleanFileName(original: string, type: AttachmentType): string {
  const printable = [...original.replace(/\\/g, '/')].filter(
    (character) => character >= ' ' && character !== '\u007f' && character !== '"',
  );
  const name = basename(printable.join('')).trim();
  return (name || `packing-slip.${EXTENSIONS[type]}`).slice(0, 200);
}

/** A packing slip belongs to a delivery still being checked in; a received or cancelled release takes none. */
function assertReceivable(release: ReleaseEntity): void {
  if (!RECEIVABLE_STATUSES.includes(release.status as DockStatus)) {
    throw new ConflictError(
      `Release ${release.number} is ${release.status}; packing slips are attached while a delivery is being received.`,
      [{ status: release.status }],
      'not_receivable',
    );
  }
}

/** A packing slip and its bytes, for sending it back. */
export interface StoredAttachment {
  attachment: DockAttachment;
  content: Buffer;
}

/** What `storage_path` says of a slip whose bytes are in the database. */
const IN_DATABASE = 'database';

/**
 * Packing-slip photos and PDFs kept with a release, in the database (so every app node serves
 * them and a backup holds them). Slips stored before that, on disk under one folder per release
 * in `attachmentsDir`, are still served from there.
 */
export class AttachmentsService {
  private readonly root: string;

  constructor(
    private readonly db: Database,
    attachmentsDir: string,
  ) {
    this.root = resolve(attachmentsDir);
  }

  async add(
    releaseId: number,
    file: { buffer: Buffer; fileName: string },
    actor: AuthenticatedUser,
  ): Promise<DockAttachment> {
    const type = sniffAttachmentType(file.buffer);
    if (!type) {
      throw new UnsupportedTypeError(
        'Attach a photo (JPEG, PNG or WebP) or a PDF of the packing slip; this file is neither.',
      );
    }
    const release = await this.db.manager.findOneBy(ReleaseEntity, { id: releaseId });
    if (!release) throw new NotFoundError(`No release with id ${releaseId}.`);
    assertReceivable(release);
    return this.db.write(async (manager) => {
      // Checked again inside the unit: the release may have been received in full meanwhile.
      assertReceivable(await manager.findOneByOrFail(ReleaseEntity, { id: release.id }));
      const attachment = await manager.save(
        manager.create(AttachmentEntity, {
          releaseId: release.id,
          receiptId: null,
          fileName: cleanFileName(file.fileName, type),
          mimeType: type,
          sizeBytes: file.buffer.length,
          storagePath: IN_DATABASE,
          uploadedBy: actor.email,
          uploadedAt: new Date().toISOString(),
        }),
      );
      await manager.insert(AttachmentContentEntity, {
        attachmentId: attachment.id,
        contentBase64: file.buffer.toString('base64'),
      });
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'attach',
        entity: 'release',
        entityKey: release.number,
        changes: {
          attachmentId: attachment.id,
          fileName: attachment.fileName,
          mimeType: type,
          sizeBytes: attachment.sizeBytes,
        },
      });
      await bumpDockVersion(manager);
      return toDockAttachment(attachment);
    });
  }

  /** The attachment and its bytes; 404 when either is gone. */
  async find(id: number): Promise<StoredAttachment> {
    const attachment = await this.db.manager.findOneBy(AttachmentEntity, { id });
    if (!attachment) throw new NotFoundError(`No attachment with id ${id}.`);
    const content =
      attachment.storagePath === IN_DATABASE
        ? await this.db.manager.findOneBy(AttachmentContentEntity, { attachmentId: id })
        : null;
    const bytes = content
      ? Buffer.from(content.contentBase64, 'base64')
      : await readFile(this.locate(attachment.storagePath)).catch(() => null);
    if (!bytes) throw new NotFoundError(`The file of attachment ${id} is missing from storage.`);
    return { attachment: toDockAttachment(attachment), content: bytes };
  }

  // Stored paths are ours, but a path read back from the database still must not leave the folder.
  private locate(storagePath: string): string {
    const absolutePath = resolve(this.root, storagePath);
    if (!absolutePath.startsWith(this.root + sep)) throw new NotFoundError('No such attachment file.');
    return absolutePath;
  }
}
