// The audit log as a spreadsheet (XLSX or CSV) with the screen's filters: one row per changed
// field — time (UTC), person, action, entity, field, before, after — so a reviewer filters and sorts
// it like any table; an event without fields (a sign-in) is one row. Text is formula-safe (the one
// sheet writer). Admins only; the export itself is audited by its route.
import { auditChangeLines } from '../../shared/audit/changes'
import type { AuditQuery } from '../../shared/schemas/auth'
import { addCautionSheet, addTableSheet, blankRow, headingRow, newWorkbook, valueRow, type CellValue, type SheetColumn } from '../utils/sheets'
import { AUDIT_EXPORT_LIMIT, auditEventsForExport } from './audit-log'

export const AUDIT_COLUMNS: SheetColumn[] = [
  { header: 'Time (UTC)', key: 'at', unit: 'ISO 8601, UTC', width: 24 },
  { header: 'Person', key: 'person', unit: '', width: 22 },
  { header: 'E-mail', key: 'email', unit: '', width: 28 },
  { header: 'Action', key: 'action', unit: '', width: 14 },
  { header: 'Entity', key: 'entity', unit: '', width: 18 },
  { header: 'Entity id', key: 'entityId', unit: '', width: 38 },
  { header: 'Field', key: 'field', unit: '', width: 22 },
  { header: 'Before', key: 'before', unit: '', width: 30, note: 'Blank: the field did not exist before (a record created).' },
  { header: 'After', key: 'after', unit: '', width: 30, note: 'Blank: the field does not exist after (a record deleted).' },
  { header: 'Client address', key: 'ip', unit: '', width: 16 },
  { header: 'Via', key: 'via', unit: '', width: 22, note: 'How the person acted: blank for a signed-in session, "token <name>" for an API token.' },
  { header: 'Event id', key: 'eventId', unit: '', width: 38 },
]

/** The export's rows, one per changed field (newest event first), and how many events matched. */
export async function auditExportRows(organisationId: string, q: Omit<AuditQuery, 'page'>): Promise<{ rows: Record<string, CellValue>[], events: number, total: number }> {
  const { events, total } = await auditEventsForExport(organisationId, q)
  const rows: Record<string, CellValue>[] = []
  for (const e of events) {
    const base = {
      at: e.at.toISOString(), person: e.personName ?? '', email: e.personEmail ?? '', action: e.action, entity: e.entity,
      entityId: e.entityId ?? null, ip: e.ipAddress ?? null, via: e.via ?? null, eventId: e.id,
    }
    const lines = auditChangeLines(e.before, e.after)
    // Blank (not an empty text) where an event has no fields or a field had no value before or after.
    if (lines.length === 0) rows.push({ ...base, field: null, before: null, after: null })
    for (const l of lines) rows.push({ ...base, field: l.field, before: l.before ?? null, after: l.after ?? null })
  }
  return { rows, events: events.length, total }
}

export async function auditWorkbook(organisationId: string, q: Omit<AuditQuery, 'page'>, o: { organisationName: string, exportedBy: string }) {
  const { rows, events, total } = await auditExportRows(organisationId, q)
  const wb = newWorkbook()
  addCautionSheet(wb, {
    name: 'About',
    title: 'Stormledger audit log',
    caution: 'Who changed what and when in this organisation, as recorded by Stormledger. One row per changed field; sign-ins and other events without fields are one row each.',
    rows: [
      valueRow('Organisation', o.organisationName),
      blankRow,
      headingRow('Filters'),
      valueRow('Person', q.person ?? 'everyone'), valueRow('Entity', q.entity ?? 'every entity'),
      valueRow('From (UTC day)', q.from ?? 'the first event'), valueRow('To (UTC day, inclusive)', q.to ?? 'the last event'),
      blankRow,
      valueRow('Events, count', events),
      valueRow('Events matching the filters, count', total),
      ...(total > events ? [valueRow('Not included', `The newest ${AUDIT_EXPORT_LIMIT.toLocaleString('en-GB')} events are exported; narrow the dates for the older ones.`)] : []),
      valueRow('Exported by', o.exportedBy), valueRow('Exported (UTC)', new Date().toISOString()),
    ],
  })
  addTableSheet(wb, 'Audit log', AUDIT_COLUMNS, rows)
  return { wb, events, total }
}
