import { ForbiddenException, Injectable, NotFoundException, UnsupportedMediaTypeException } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { createHash, randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { ProjectAccess } from '../common/auth-user.js';
import { fieldError } from '../common/errors.js';
import { MapsService } from '../maps/maps.service.js';
import type { UploadDto } from './dto/upload.dto.js';
import { checkLatticeJson } from './lattice-json.js';
import { parseMeasurementsCsv } from './measurements-csv.js';

/** What multer hands over (memory storage). */
export interface UploadedFileData {
  originalname: string;
  mimetype: string;
  size: number;
  buffer: Buffer;
}

const CSV_TYPES = ['text/csv', 'text/plain', 'application/csv', 'application/vnd.ms-excel', 'application/octet-stream'];
const JSON_TYPES = ['application/json', 'text/plain', 'application/octet-stream'];
const COLUMNS =
  'id, kind, file_name AS fileName, content_type AS contentType, size, sha256, map_id AS mapId, uploaded_by AS uploadedBy, created_at AS createdAt';

/** Text of an upload: UTF-8 without NUL bytes (a binary file is refused). */
function textOf(file: UploadedFileData): string {
  if (file.buffer.includes(0)) throw new UnsupportedMediaTypeException({ message: `${file.originalname} is not a text file`, details: null });
  const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
  if (text.includes('\uFFFD')) throw new UnsupportedMediaTypeException({ message: `${file.originalname} is not UTF-8 text`, details: null });
  return text;
}

function checkType(file: UploadedFileData | undefined, extension: string, types: string[]): UploadedFileData {
  if (!file) throw fieldError('file', 'attach the file as multipart/form-data field "file"');
  const name = file.originalname.toLowerCase();
  if (!name.endsWith(extension) || !types.includes(file.mimetype)) {
    throw new UnsupportedMediaTypeException({ message: `Expected a ${extension} file (got "${file.originalname}", ${file.mimetype})`, details: { fileName: file.originalname, contentType: file.mimetype } });
  }
  return file;
}

@Injectable()
export class UploadsService {
  constructor(
    @InjectConnection() private readonly sequelize: Sequelize,
    private readonly maps: MapsService,
  ) {}

  async measurements(access: ProjectAccess, userId: string, file: UploadedFileData | undefined, parametersField: string | undefined, mapId: string | undefined): Promise<UploadDto> {
    const f = checkType(file, '.csv', CSV_TYPES);
    let parameters = (parametersField ?? '').split(',').map((p) => p.trim()).filter(Boolean);
    if (mapId) {
      const map = await this.maps.find(access.projectId, mapId);
      if (parameters.length === 0) parameters = (JSON.parse(map.sweep) as { axes: { parameter: string }[] }).axes.map((a) => a.parameter);
    }
    if (parameters.length === 0) throw fieldError('parameters', 'name the parameter columns (e.g. "V,mu"), or give mapId to use its swept parameters');
    const summary = parseMeasurementsCsv(textOf(f), parameters);
    return this.store(access.projectId, userId, 'measurements', f, summary, mapId ?? null);
  }

  async lattice(access: ProjectAccess, userId: string, file: UploadedFileData | undefined): Promise<UploadDto> {
    const f = checkType(file, '.json', JSON_TYPES);
    const checked = checkLatticeJson(textOf(f));
    return this.store(access.projectId, userId, 'lattice', f, checked, null);
  }

  private async store(projectId: string, userId: string, kind: 'measurements' | 'lattice', f: UploadedFileData, summary: unknown, mapId: string | null): Promise<UploadDto> {
    const id = randomUUID();
    const sha256 = createHash('sha256').update(f.buffer).digest('hex');
    const type = kind === 'measurements' ? 'text/csv' : 'application/json';
    await this.sequelize.query('INSERT INTO uploads (id, project_id, kind, file_name, content_type, size, sha256, content, summary, map_id, uploaded_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)', {
      replacements: [id, projectId, kind, f.originalname.slice(0, 255), type, f.size, sha256, f.buffer, JSON.stringify(summary), mapId, userId],
    });
    return this.get(projectId, id, true);
  }

  async list(projectId: string): Promise<UploadDto[]> {
    return this.sequelize.query<UploadDto>(`SELECT ${COLUMNS} FROM uploads WHERE project_id = ? ORDER BY created_at DESC, id`, { type: QueryTypes.SELECT, replacements: [projectId] });
  }

  async get(projectId: string, id: string, withSummary = true): Promise<UploadDto> {
    const rows = await this.sequelize.query<UploadDto & { summaryText?: string }>(`SELECT ${COLUMNS}${withSummary ? ', summary AS summaryText' : ''} FROM uploads WHERE project_id = ? AND id = ?`, {
      type: QueryTypes.SELECT,
      replacements: [projectId, id],
    });
    if (rows.length === 0) throw new NotFoundException({ message: 'No such upload in this project', details: null });
    const { summaryText, ...row } = rows[0];
    return { ...row, ...(summaryText ? { summary: JSON.parse(summaryText) as unknown } : {}) };
  }

  async content(projectId: string, id: string): Promise<{ name: string; type: string; body: Buffer }> {
    const rows = await this.sequelize.query<{ fileName: string; contentType: string; content: Buffer }>('SELECT file_name AS fileName, content_type AS contentType, content FROM uploads WHERE project_id = ? AND id = ?', {
      type: QueryTypes.SELECT,
      replacements: [projectId, id],
    });
    if (rows.length === 0) throw new NotFoundException({ message: 'No such upload in this project', details: null });
    return { name: rows[0].fileName, type: rows[0].contentType, body: rows[0].content };
  }

  /** Deleted by its uploader or a project owner. */
  async remove(access: ProjectAccess, userId: string, id: string): Promise<void> {
    const upload = await this.get(access.projectId, id, false);
    if (upload.uploadedBy !== userId && access.role !== 'owner') {
      throw new ForbiddenException({ message: 'Only the uploader or a project owner may delete this file', details: null });
    }
    await this.sequelize.query('DELETE FROM uploads WHERE project_id = ? AND id = ?', { replacements: [access.projectId, id] });
  }
}
