/**
 * The native menu, with the usual keyboard shortcuts (role items bring the platform's own).
 * Undo and redo show their shortcuts but do not register them, so that Ctrl+Z reaches the page,
 * where the project's own undo history handles it (and text fields their native undo).
 */
import type { MenuItemConstructorOptions } from 'electron';

export function buildMenuTemplate(platform: NodeJS.Platform): MenuItemConstructorOptions[] {
  const mac = platform === 'darwin';
  return [
    ...(mac ? [{ role: 'appMenu' as const }] : []),
    { label: 'File', submenu: [mac ? { role: 'close' as const } : { role: 'quit' as const }] },
    {
      label: 'Edit',
      submenu: [
        { role: 'undo', registerAccelerator: false },
        { role: 'redo', registerAccelerator: false },
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
