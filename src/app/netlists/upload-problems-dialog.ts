/**
 * Why an upload was refused, file by file. The server stores all files or none, so the dialog
 * says that nothing was kept and which files to fix.
 */
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import type { ApiError } from '../core/team-api';

/** One refused file, as the server lists it in `details`. */
export interface FileProblem {
  file: string;
  code: string;
  message: string;
}

export interface UploadProblemsData {
  message: string;
  problems: FileProblem[];
}

/** The per-file problems of a refused upload (400/413/415 `details`), or [] if the answer has none. */
export function fileProblemsOf(error: ApiError): FileProblem[] {
  if (!Array.isArray(error.details)) return [];
  return error.details
    .filter((d): d is Record<string, unknown> => !!d && typeof d === 'object')
    .map((d) => ({
      file: typeof d['file'] === 'string' ? d['file'] : '',
      code: typeof d['code'] === 'string' ? d['code'] : '',
      message: typeof d['message'] === 'string' ? d['message'] : '',
    }))
    .filter((p) => p.file || p.message);
}

@Component({
  selector: 'nw-upload-problems-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Nothing was uploaded</h2>
    <mat-dialog-content>
      <p>{{ data.message }} Files are stored all together or not at all: fix the ones below or leave them out, then upload again.</p>
      <ul class="problems">
        @for (p of data.problems; track $index) {
          <li><span class="file">{{ p.file || 'The upload' }}</span> <span class="why">{{ p.message }}</span></li>
        }
      </ul>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-flat-button type="button" mat-dialog-close cdkFocusInitial>OK</button>
    </mat-dialog-actions>
  `,
  styles: `
    .problems { margin: 0; padding: 0; list-style: none; max-width: 520px; }
    li { padding: 6px 0; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .file { display: block; font-weight: 600; font-family: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 0.875rem; }
    .why { display: block; color: #8c1d18; }
  `,
})
export class UploadProblemsDialog {
  protected readonly data = inject<UploadProblemsData>(MAT_DIALOG_DATA);
}
