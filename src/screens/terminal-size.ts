import { useStdout } from 'ink';
import { useEffect, useState } from 'react';

/** The terminal's size, following resizes (Ink re-draws on resize but does not re-render components). */
export function useTerminalSize(): { columns: number; rows: number } {
  const { stdout } = useStdout();
  // A terminal that reports no size (0 x 0) gets the smallest size the screen is made for.
  const read = () => ({ columns: stdout.columns || 80, rows: stdout.rows || 24 });
  const [size, setSize] = useState(read);
  useEffect(() => {
    const onResize = () => setSize(read());
    stdout.on('resize', onResize);
    return () => {
      stdout.off('resize', onResize);
    };
  }, [stdout]);
  return size;
}

