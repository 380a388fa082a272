import { SOLID_UPLOAD_MAX_BYTES, type UploadedSolid } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Typography from '@mui/material/Typography';
import { type DragEvent, useRef, useState } from 'react';

/** Drop an OBJ or OFF file of a convex solid (or pick one); it is read in the browser with a progress bar. */
export function SolidDropZone({
  upload,
  onUpload,
}: {
  upload: UploadedSolid | null;
  onUpload: (solid: UploadedSolid) => void;
}) {
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [over, setOver] = useState(false);

  // A refused file changes nothing: the solid in use, if any, stays, and the message says so (its own
  // errors, shown with the design's, are then not this file's).
  const refuse = (message: string) =>
    setError(
      upload ? `${message} The design still uses ${upload.name ?? 'the solid uploaded before'}.` : message,
    );
  const read = (file: File) => {
    setError(null);
    const ext = file.name.split('.').pop()?.toLowerCase();
    if (ext !== 'obj' && ext !== 'off') {
      refuse('Only .obj and .off files of a convex solid can be used.');
      return;
    }
    if (file.size > SOLID_UPLOAD_MAX_BYTES) {
      refuse(`The file is larger than ${SOLID_UPLOAD_MAX_BYTES / 1024 / 1024} MB.`);
      return;
    }
    const reader = new FileReader();
    reader.onprogress = (e) => setProgress(e.lengthComputable ? (100 * e.loaded) / e.total : 50);
    reader.onerror = () => {
      setProgress(null);
      refuse('The file could not be read.');
    };
    reader.onload = () => {
      setProgress(null);
      onUpload({ format: ext, text: String(reader.result), name: file.name.replace(/\.(obj|off)$/i, '') });
    };
    setProgress(0);
    reader.readAsText(file);
  };

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    const file = e.dataTransfer.files[0];
    if (file) read(file);
  };

  return (
    <Box
      data-testid="solid-drop-zone"
      onDragOver={(e) => {
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
      sx={{
        border: '2px dashed',
        borderColor: over ? 'primary.main' : 'divider',
        borderRadius: 1,
        p: 2,
        textAlign: 'center',
      }}
    >
      <Typography variant="body2" sx={{ mb: 1 }}>
        {upload
          ? `Using ${upload.name ?? 'the uploaded solid'} (${upload.format.toUpperCase()})`
          : 'Drop an OBJ or OFF file here'}
      </Typography>
      <Button size="small" variant="outlined" onClick={() => input.current?.click()}>
        Choose a file
      </Button>
      <input
        ref={input}
        hidden
        type="file"
        accept=".obj,.off"
        aria-label="Solid file"
        onChange={(e) => {
          const file = e.target.files?.[0];
          if (file) read(file);
          e.target.value = '';
        }}
      />
      {progress !== null ? (
        <LinearProgress variant="determinate" value={progress} sx={{ mt: 1 }} aria-label="Reading the file" />
      ) : null}
      {error ? (
        <Typography color="error" variant="body2" sx={{ mt: 1 }} role="alert">
          {error}
        </Typography>
      ) : null}
    </Box>
  );
}
