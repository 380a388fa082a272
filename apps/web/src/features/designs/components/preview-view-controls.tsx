import Box from '@mui/material/Box';
import IconButton from '@mui/material/IconButton';
import SvgIcon from '@mui/material/SvgIcon';
import Tooltip from '@mui/material/Tooltip';
import { type ReactNode } from 'react';
import { type ViewCommand } from './preview-view';

/** Line drawings: 24 × 24, stroked in the text colour. */
function LineIcon({ children }: { children: ReactNode }) {
  return (
    <SvgIcon>
      <g fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
        {children}
      </g>
    </SvgIcon>
  );
}

/** A vertical axis with an arrow round it from behind, across its front to the left or to the right. */
function TurnIcon({ towards }: { towards: 'left' | 'right' }) {
  return (
    <>
      <path d="M12 3v18" strokeWidth={1.5} strokeDasharray="2 2.5" />
      {towards === 'left' ? (
        <path d="M18.89 9.11A9 4.5 0 0 1 6.21 15.45M7.86 18.65 6.21 15.45 9.65 14.38" />
      ) : (
        <path d="M5.11 9.11A9 4.5 0 0 0 17.79 15.45M16.14 18.65 17.79 15.45 14.35 14.38" />
      )}
    </>
  );
}

/** The turn drawing on its side: round a horizontal axis, upwards or downwards. */
function TiltIcon({ towards }: { towards: 'up' | 'down' }) {
  return (
    <g transform="rotate(90 12 12)">
      <TurnIcon towards={towards === 'up' ? 'left' : 'right'} />
    </g>
  );
}

function ZoomIcon({ closer }: { closer: boolean }) {
  return (
    <>
      <circle cx={10} cy={10} r={6} />
      <path d={closer ? 'M14.5 14.5 20 20M7.5 10h5M10 7.5v5' : 'M14.5 14.5 20 20M7.5 10h5'} />
    </>
  );
}

/** An arrow most of the way round a point: back to where the view started. */
function ResetIcon() {
  return (
    <>
      <path d="M4.5 12a7.5 7.5 0 1 0 2.2-5.3M6.7 2.7v4h4" />
      <path d="M12 12h.01" strokeWidth={3} />
    </>
  );
}

const BUTTONS: { command: ViewCommand; label: string; icon: ReactNode }[] = [
  { command: 'turn-left', label: 'Turn model left', icon: <TurnIcon towards="left" /> },
  { command: 'turn-right', label: 'Turn model right', icon: <TurnIcon towards="right" /> },
  { command: 'tilt-up', label: 'Tilt model up', icon: <TiltIcon towards="up" /> },
  { command: 'tilt-down', label: 'Tilt model down', icon: <TiltIcon towards="down" /> },
  { command: 'zoom-in', label: 'Zoom in', icon: <ZoomIcon closer /> },
  { command: 'zoom-out', label: 'Zoom out', icon: <ZoomIcon closer={false} /> },
  { command: 'reset', label: 'Reset view', icon: <ResetIcon /> },
];

/**
 * Buttons that move the 3D preview one step each: the same steps as the keys, for anyone who cannot drag or
 * pinch (WCAG 2.5.1) and for a screen without a keyboard.
 */
export function PreviewViewControls({ onCommand }: { onCommand: (command: ViewCommand) => void }) {
  return (
    <Box role="group" aria-label="Move the 3D preview" sx={{ display: 'flex', flexWrap: 'wrap' }}>
      {BUTTONS.map(({ command, label, icon }) => (
        <Tooltip key={command} title={label}>
          <IconButton aria-label={label} onClick={() => onCommand(command)}>
            <LineIcon>{icon}</LineIcon>
          </IconButton>
        </Tooltip>
      ))}
    </Box>
  );
}
