// Supervisor operations shared by the JSON API and the web pages.
import { canonicalJson, formatEnrolmentTicket, newEnrolmentCode, randomUuid } from '../../protocol/index.js';
import { parseSeamFile, SEAM_FILE_FORMAT, type Seam } from '../../domain/index.js';
import { accountWithoutHash } from '../auth/account-without-hash.js';
import { tokenHash } from '../auth/tokens.js';
import type { AppDeps } from '../deps.js';
import { foldSeam } from '../grading/fold.js';
import { HttpError } from '../http/errors.js';
import { recordDecision, type DecisionInput } from '../review/decisions.js';
import type { Account, SeamNamespace } from '../storage/types.js';

export interface IssuedCode {
  readonly code: string;
  /** The text of the QR code: the code and the server key's kid. */
  readonly ticket: string;
  readonly expiresAt: string;
  readonly serverKid: string;
  /** The inspector the enrolled device will work for. */
  readonly inspector: string | null;
}

/** A one-time code; a device enrolled with it works for the inspector named, when one is. */
export async function issueEnrolmentCode(
  deps: AppDeps,
  by: Account,
  inspector: string | null = null,
): Promise<IssuedCode> {
  const account = inspector === null ? null : await inspectorAccount(deps, inspector);
  const code = newEnrolmentCode();
  const now = deps.now();
  const expiresAt = new Date(now.getTime() + deps.config.enrolmentCodeMinutes * 60_000).toISOString();
  await deps.storage.createEnrolmentCode({
    codeHash: tokenHash(code),
    createdBy: by.id,
    createdAt: now.toISOString(),
    expiresAt,
    inspectorId: account?.id ?? null,
  });
  deps.log.info('enrolmentCodeIssued', { by: by.username, expiresAt, inspector: account?.username ?? null });
  return {
    inspector: account?.username ?? null,
    code,
    ticket: formatEnrolmentTicket({ code, serverKid: deps.serverKey.kid }),
    expiresAt,
    serverKid: deps.serverKey.kid,
  };
}

/** The seam set-up checked with the grading core's rules; a 400 lists every problem. */
export function checkSeamSetup(input: unknown): Seam {
  const parsed = parseSeamFile(
    {
      format: SEAM_FILE_FORMAT,
      units: { length: 'mm', angle: 'deg' },
      seam: input,
      rounds: [{ number: 1, kind: 'first', checklist: {} }],
      readings: [],
    },
    { allowNoReadings: true },
  );
  if (!parsed.ok) {
    throw new HttpError(400, 'invalid', parsed.problems.map((p) => `${p.path}: ${p.message}`).join('; '));
  }
  return parsed.value.seam;
}

export async function putSeam(
  deps: AppDeps,
  by: Account | null,
  seam: Seam,
  namespace: SeamNamespace,
): Promise<'created' | 'updated'> {
  const existing = await deps.storage.getSeam(seam.id);
  if (existing && existing.namespace !== namespace) {
    throw new HttpError(
      409,
      'namespace',
      `seam "${seam.id}" is a ${existing.namespace} seam; it cannot become ${namespace}`,
    );
  }
  const result = await deps.storage.putSeam(
    { id: seam.id, namespace, setup: canonicalJson(seam), createdAt: deps.now().toISOString() },
    by?.id ?? null,
  );
  deps.regrader.schedule([seam.id]);
  return result;
}

/** The seam's current set-up: the newest a device sent, else the one set up on the server. */
async function currentSetup(deps: AppDeps, seamId: string): Promise<Seam> {
  const seam = foldSeam(await deps.storage.seamMaterial(seamId)).seam;
  if (!seam) throw new HttpError(404, 'unknownSeam', `no seam "${seamId}" is known to this server`);
  return seam;
}

/** Who a seam is assigned to: one tablet, or an inspector account (every device tied to it pulls the seam). */
export type AssignTarget =
  | { readonly deviceKid: string; readonly inspector?: undefined }
  | { readonly inspector: string; readonly deviceKid?: undefined };

/** The inspector account named, or a 4xx saying why it cannot be assigned to. */
export async function inspectorAccount(deps: AppDeps, username: string): Promise<Account> {
  const account = await deps.storage.findAccount(username);
  if (!account) throw new HttpError(404, 'unknownInspector', `no account is named "${username}"`);
  if (account.role !== 'inspector')
    throw new HttpError(409, 'notInspector', `the account "${username}" is not an inspector's`);
  return accountWithoutHash(account);
}

export async function assignSeam(
  deps: AppDeps,
  by: Account,
  input: AssignTarget & { seamId: string; note?: string | undefined },
): Promise<{ id: string; seq: number }> {
  let deviceKid: string | null = null;
  let inspector: Account | null = null;
  if (input.deviceKid !== undefined) {
    const device = await deps.storage.getDevice(input.deviceKid);
    if (!device) throw new HttpError(404, 'unknownDevice', 'no device is enrolled with this kid');
    if (device.revokedAt !== null) throw new HttpError(409, 'revoked', 'this device is revoked');
    deviceKid = device.kid;
  } else {
    inspector = await inspectorAccount(deps, input.inspector);
  }
  const seam = await currentSetup(deps, input.seamId);
  const id = randomUuid();
  const now = deps.now().toISOString();
  const item = {
    id,
    seamId: input.seamId,
    seam,
    ...(input.note ? { note: input.note } : {}),
    assignedBy: by.username,
    assignedAt: now,
  };
  const change = await deps.storage.addChange({
    kind: 'assignment',
    itemId: id,
    seamId: input.seamId,
    deviceKid,
    inspectorId: inspector?.id ?? null,
    item: canonicalJson(item),
    createdAt: now,
    createdBy: by.id,
  });
  deps.log.info('assigned', {
    by: by.username,
    seamId: input.seamId,
    ...(deviceKid ? { kid: deviceKid } : { inspector: inspector?.username }),
  });
  return { id, seq: change.seq };
}

/**
 * Ties a device to an inspector account (null: to none). Seams assigned to the inspector before now are sent to
 * the device as assignments of its own, carrying the same set-up and note, so it receives them whatever its cursor.
 */
export async function tieDevice(
  deps: AppDeps,
  by: Account,
  kid: string,
  inspector: string | null,
): Promise<void> {
  const account = inspector === null ? null : await inspectorAccount(deps, inspector);
  const device = await deps.storage.getDevice(kid);
  if (!device) throw new HttpError(404, 'unknownDevice', 'no such device');
  if (device.revokedAt !== null) throw new HttpError(409, 'revoked', 'this device is revoked');
  const now = deps.now().toISOString();
  await deps.storage.tieDevice(kid, account?.id ?? null, (assignment) => {
    const id = randomUuid();
    const item = { ...(JSON.parse(assignment.item) as Record<string, unknown>), id };
    return {
      kind: 'assignment',
      itemId: id,
      seamId: assignment.seamId,
      deviceKid: kid,
      item: canonicalJson(item),
      createdAt: now,
      createdBy: by.id,
    };
  });
  deps.log.info('deviceTied', { by: by.username, kid, inspector: account?.username ?? null });
}

/** A review decision (see review/decisions.ts): the id, and the change number devices pull it under. */
export async function decide(
  deps: AppDeps,
  by: Account,
  input: DecisionInput,
): Promise<{ id: string; seq: number }> {
  const decision = await recordDecision(deps, by, input);
  return { id: decision.id, seq: decision.changeSeq };
}

/** Everything the server holds on a seam: set-up, records as stored, its own grade and the devices' grades. */
export async function seamView(deps: AppDeps, seamId: string) {
  const [seam, material, grade, deviceGrades] = await Promise.all([
    deps.storage.getSeam(seamId),
    deps.storage.seamMaterial(seamId),
    deps.storage.getServerGrade(seamId),
    deps.storage.listDeviceGrades(seamId),
  ]);
  if (!seam && material.records.length === 0) {
    throw new HttpError(404, 'unknownSeam', `no seam "${seamId}" is known to this server`);
  }
  return {
    id: seamId,
    namespace: seam?.namespace ?? 'live',
    setup: foldSeam(material).seam,
    records: material.records.map((r) => ({ ...r, body: JSON.parse(r.body) as unknown })),
    serverGrade: grade ? { ...grade, summary: JSON.parse(grade.summary) as unknown } : null,
    deviceGrades: deviceGrades.map((g) => ({ ...g, grade: JSON.parse(g.grade) as unknown })),
  };
}
