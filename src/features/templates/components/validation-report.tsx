import { formatNumber } from '../../../../shared/format';
import type { ValidationRecord } from '../../../../shared/schemas/template.schema';
import { Notice } from '../../../components/ui/notice';
import { formatDateTimeUtc } from '../../../../shared/format/date';

/** The stored validation record: each check with passed / failed / not run, in words. */
export function ValidationReport({ record }: { record: ValidationRecord }) {
  const title = record.purpose === 'release' ? (record.passed ? 'Release validation passed' : 'Release refused: validation failed') : record.passed ? 'Check passed: ready to release' : 'Check found problems';
  return (
    <Notice tone={record.passed ? 'ok' : 'danger'} label={title} role="status">
      <p className="text-xs text-ink-muted">
        {record.checkedBy.name}, {formatDateTimeUtc(record.checkedAt)} · {record.engineVersion}
      </p>
      <ul className="mt-2 space-y-1">
        {record.checks.map((c) => (
          <li key={c.id}>
            <span className="inline-block w-16 font-semibold">{c.passed === true ? 'Passed' : c.passed === false ? 'Failed' : 'Not run'}</span>
            <span>{c.label}</span>
            {c.messages.length > 0 && (
              <ul className="ml-16 list-disc pl-5 text-danger">
                {c.messages.map((m, i) => <li key={i}>{m.message}</li>)}
              </ul>
            )}
          </li>
        ))}
      </ul>
      {record.referenceCase?.obtained && (
        <p className="mt-2 text-xs">
          Reference case: expected <span className="font-mono">y = {formatNumber(record.referenceCase.expected.y, { digits: 10 })}</span>, <span className="font-mono">u = {formatNumber(record.referenceCase.expected.u, { digits: 6 })}</span>; obtained{' '}
          <span className="font-mono">y = {formatNumber(record.referenceCase.obtained.y, { digits: 10 })}</span>, <span className="font-mono">u = {formatNumber(record.referenceCase.obtained.u, { digits: 6 })}</span>.
        </p>
      )}
      {record.warnings.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-xs text-ink-muted">{record.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
      )}
    </Notice>
  );
}
