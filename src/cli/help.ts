export const MAIN_HELP = `exine: a terminal counting station for pollen analysts

Usage
  exine <command> [options]

Commands
  count FILE     count a level: creates FILE, or resumes it
  demo           count a copy of the demo level in a temporary folder
  summary FILE   counts, percentages and intervals of a level
  export FILE…   levels as CSV (long or wide)
  verify FILE    check a session file's integrity chain
  keys PATH      check a keymap and show its layout

Run "exine <command> --help" for the options of one command.`;

export const HELP: Readonly<Record<string, string>> = {
  count: `Usage
  exine count FILE [options]

Opens the counting screen for one level. A new FILE is created with the
keymap and level details given; an existing FILE is resumed with the keymap
and details recorded in it.

Options
  --keymap PATH|NAME  keymap for a new level (default: temperate-lowland;
                      bundled: temperate-lowland, keypad)
  --level L           level label (default: the file name)
  --depth D           depth of the level in the core (a number, e.g. cm)
  --site S            site name
  --core C            core label
  --slide S           slide label
  --analyst A         who counts
  --target N          target pollen sum (default 500; about 300 where pollen is sparse)
  -h, --help          this help

Keys
  taxon keys count one grain each; Backspace undoes the last grain; Tab starts
  the next traverse (the keymap may move these); Ctrl-F then y marks the level
  finished and quits; Ctrl-C quits (every grain is on disk already).

Examples
  exine count km1-112cm.jsonl --core KM-1 --depth 112 --slide KM1-112-A
  exine count km1-112cm.jsonl          (resume the next day)`,
  demo: `Usage
  exine demo

Copies the half-counted demo level (demo-sessions/) into a temporary folder
and opens it for counting. The bundled demo files are never changed.`,
  summary: `Usage
  exine summary FILE [--json]

Prints the level's counts, percentages of the pollen sum and 95% Wilson
intervals. Reads the file without changing it.

Options
  --json      one JSON object instead of a table
  -h, --help  this help`,
  export: `Usage
  exine export FILE… [--format long|wide] [--out PATH] [--force]

Writes levels as CSV (RFC 4180, UTF-8, header row). long: one row per level
and taxon, with percentages and intervals. wide: one row per level, one count
column per taxon, levels in depth order.

Options
  --format F  long (default) or wide
  --out PATH  write to PATH (atomically) instead of standard output
  --force     replace PATH if it exists
  -h, --help  this help

Examples
  exine export km1-*.jsonl --format wide --out km1-counts.csv`,
  verify: `Usage
  exine verify FILE

Checks every line of a session file: valid JSON, consecutive seq, the hash
chain, event fields, timestamps in order. Exit 0 when intact; exit 1 naming
the first bad line and what is wrong.`,
  keys: `Usage
  exine keys PATH|NAME

Checks a keymap file and draws its layout. NAME is a bundled keymap
(temperate-lowland, keypad).`,
};
