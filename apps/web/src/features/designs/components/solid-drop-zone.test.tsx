import { fireEvent, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { SolidDropZone } from './solid-drop-zone';

describe('the solid file drop zone', () => {
  it('refuses a file that is no OBJ or OFF and says the solid in use stays', async () => {
    const onUpload = vi.fn();
    renderWithProviders(
      <SolidDropZone upload={{ format: 'off', text: 'OFF', name: 'Lamp cube' }} onUpload={onUpload} />,
    );
    // Past the picker's filter, as a file dropped on the zone is.
    fireEvent.change(screen.getByLabelText('Solid file'), {
      target: { files: [new File(['v 0 0 0'], 'notes.txt')] },
    });
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'Only .obj and .off files of a convex solid can be used. The design still uses Lamp cube.',
    );
    expect(onUpload).not.toHaveBeenCalled();
  });

  it('reads an OBJ file and hands it over with its name', async () => {
    const onUpload = vi.fn();
    const { user } = renderWithProviders(<SolidDropZone upload={null} onUpload={onUpload} />);
    await user.upload(screen.getByLabelText('Solid file'), new File(['v 0 0 0\n'], 'Tall diamond.obj'));
    await vi.waitFor(() =>
      expect(onUpload).toHaveBeenCalledWith({ format: 'obj', text: 'v 0 0 0\n', name: 'Tall diamond' }),
    );
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});
