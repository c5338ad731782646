/** The native menu, with the usual keyboard shortcuts (role items bring the platform's own). */
import type { MenuItemConstructorOptions } from 'electron';

export function buildMenuTemplate(platform: NodeJS.Platform): MenuItemConstructorOptions[] {
  const mac = platform === 'darwin';
  return [
    ...(mac ? [{ role: 'appMenu' as const }] : []),
    { label: 'File', submenu: [mac ? { role: 'close' as const } : { role: 'quit' as const }] },
    {
      label: 'Edit',
      submenu: [
        { role: 'undo' },
        { role: 'redo' },
        { type: 'separator' },
        { role: 'cut' },
        { role: 'copy' },
        { role: 'paste' },
        { role: 'selectAll' },
      ],
    },
    {
      label: 'View',
      submenu: [
        { role: 'resetZoom' },
        { role: 'zoomIn' },
        { role: 'zoomOut' },
        { type: 'separator' },
        { role: 'togglefullscreen' },
      ],
    },
    { role: 'windowMenu' },
  ];
}
