import { type FormEvent, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { isApiError } from '@/lib/api-client';
import { useUploadTargets } from '../api/upload-targets';
import { plural } from '../lib/format';
import { type CatalogueReport, fieldLabel } from '../lib/targets';
import { FilePicker } from './file-picker';

interface CatalogueUploadProps {
  campaignId: number;
  disabled: boolean;
}

export function CatalogueUpload({ campaignId, disabled }: CatalogueUploadProps) {
  const upload = useUploadTargets();
  const [files, setFiles] = useState<File[]>([]);
  const [problem, setProblem] = useState<string | undefined>();
  const [report, setReport] = useState<{ fileName: string; report: CatalogueReport } | null>(null);
  const formRef = useRef<HTMLFormElement>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    const file = files[0];
    if (!file) {
      setProblem('Choose a catalogue file (CSV).');
      return;
    }
    setProblem(undefined);
    upload.mutate(
      { campaignId, file },
      {
        onSuccess: (answer) => {
          setReport({ fileName: file.name, report: answer });
          setFiles([]);
          formRef.current?.reset();
        },
      },
    );
  }

  const serverError = upload.isError
    ? isApiError(upload.error)
      ? (upload.error.fields.file ?? upload.error.message)
      : 'Something went wrong.'
    : undefined;

  return (
    <div className="flex flex-col gap-4">
      <form ref={formRef} noValidate onSubmit={submit} className="flex flex-col gap-4">
        <FilePicker
          label="Catalogue file"
          hint="CSV with a header row: designation, ra, dec (degrees or sexagesimal), magnitude, stellar_radius, stellar_mass, teff. A star already in the catalogue is updated."
          accept=".csv,.tsv,.txt,text/csv"
          files={files}
          onFiles={(chosen) => {
            setFiles(chosen);
            setProblem(undefined);
          }}
          error={problem}
          disabled={disabled}
        />
        <div>
          <Button type="submit" variant="secondary" busy={upload.isPending} disabled={disabled}>
            Upload catalogue
          </Button>
        </div>
      </form>
      <div aria-live="polite" className="flex flex-col gap-4 empty:hidden">
        {serverError ? (
          <Alert tone="danger" title="The catalogue was not read">
            {serverError}
          </Alert>
        ) : null}
        {report && !upload.isPending ? (
          <CatalogueReportView fileName={report.fileName} report={report.report} />
        ) : null}
      </div>
    </div>
  );
}

function CatalogueReportView({ fileName, report }: { fileName: string; report: CatalogueReport }) {
  const assumedRows = report.rows.filter((row) => row.status === 'accepted' && row.assumed?.length).length;
  return (
    <section aria-label={`Report on ${fileName}`} className="flex flex-col gap-3">
      <Alert tone={report.rejected > 0 ? 'note' : 'success'} title={`Read ${fileName}`}>
        <p>
          {plural(report.created, 'target')} added, <span className="tabular">{report.updated}</span> updated,{' '}
          <span className="tabular">{report.rejected}</span> rejected.
          {assumedRows > 0
            ? ` ${plural(assumedRows, 'row')} lacked stellar parameters; Sun-like values are assumed and tagged.`
            : ''}
        </p>
      </Alert>
      {report.rows.length > 0 ? (
        <Table caption={`Row by row report on ${fileName}`}>
          <TableHead>
            <Th>Line</Th>
            <Th>Designation</Th>
            <Th>Result</Th>
            <Th>Notes</Th>
          </TableHead>
          <TableBody>
            {report.rows.map((row) => (
              <Tr key={row.line}>
                <Td label="Line">
                  <span className="tabular text-slate">{row.line}</span>
                </Td>
                <Td label="Designation">
                  <span className="tabular text-ink md:whitespace-nowrap">{row.designation ?? '—'}</span>
                </Td>
                <Td label="Result">
                  {row.status === 'accepted' ? (
                    <Badge tone="success">Accepted</Badge>
                  ) : (
                    <Badge tone="danger">Rejected</Badge>
                  )}
                </Td>
                <Td label="Notes" card="block" className="md:w-full">
                  {row.reason ? <span className="text-sm text-danger">{row.reason}</span> : null}
                  {row.assumed?.length ? (
                    <span className="flex flex-wrap items-center gap-1.5 text-sm text-muted">
                      {row.assumed.map((field) => (
                        <Badge key={field} tone="amber">
                          {fieldLabel(field)} assumed
                        </Badge>
                      ))}
                    </span>
                  ) : null}
                  {!row.reason && !row.assumed?.length ? <span className="text-sm text-muted">—</span> : null}
                </Td>
              </Tr>
            ))}
          </TableBody>
        </Table>
      ) : null}
    </section>
  );
}
