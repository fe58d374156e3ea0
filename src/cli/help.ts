export const MAIN_HELP = `exine: a terminal counting station for pollen analysts

Usage
  exine <command> [options]

Commands
  count FILE     count a level: creates FILE, or resumes it
  demo           count a fresh copy of the demo level (in the temp folder)
  audit FILE     review a level traverse by traverse; correct it (--plain:
                 a report)
  summary FILE   statistics and stop-rule state of a level
  export FILE…   levels as CSV (long, wide, or their notes)
  verify FILE    check a session file's integrity chain
  keys PATH      check or make a keymap (new, edit, from-list); print its card
  prefs          show or set preferences (bell, rare, break, keymap, analyst)
  core init DIR  make a core folder (core.json: keymap, rules, markers, depths)
  core DIR       the levels of a core at a glance

Run "exine <command> --help" for the options of one command.`;

export const HELP: Readonly<Record<string, string>> = {
  count: `Usage
  exine count FILE [options]

Opens the counting screen for one level. A new FILE is created with the
keymap and level details given; an existing FILE is resumed with the keymap
and details recorded in it.

Options
  --keymap PATH|NAME  keymap for a new level (default: the keymap preference,
                      else temperate-lowland; bundled: temperate-lowland,
                      keypad)
  --level L           level label (default: the file name)
  --depth D           depth of the level in the core (a number, e.g. cm);
                      with a core folder for FILE, the level to count
                      (exine count DIR --depth D: see exine core --help);
                      a depth below 0 is written --depth=-3 and needs
  --allow-negative-depth  (a core measured from a datum above the sediment)
  --site S            site name
  --core C            core label
  --slide S           slide label; on resume another slide is recorded
                      and counting goes on on it (traverse numbers go on)
  --analyst A         who counts (default: the analyst preference)
  --quiet             no terminal bells (preference: bell)
  --rare N            list types with at most N grains as rare
                      (preference: rare)
  --break MIN|off     remind to rest the eyes after MIN minutes
                      (preference: break)
  --reopen "REASON"   count on in a finished level (recorded with the reason);
                      without it a finished level opens read-only
  -h, --help          this help

Stop rules (recorded in FILE; on resume a flag changes only its own rule,
and "off" drops it). With no rule flag a new level gets --target 500.
  --target N          pollen sum to reach (common practice 500; about 300
                      where pollen is sparse)
  --precision H       every qualifying taxon's 95% interval within ±H
                      percentage points; qualifying taxa are those at or above
  --precision-share P   P percent of the sum (default 5), or
  --precision-taxa A,B  the taxa named
  --coverage C        sample coverage (Chao & Jost 2012) at least C, e.g. 0.99;
                      judged from a pollen sum of 100 on
  --plateau K         no new type in the last K grains of the sum
  --markers M         at least M exotic marker grains counted
  --conc-error R      concentration relative error at most R (0.1 or 10%)
  --rule-mode all|any the set is met when all rules are (default) or any one
  --min-sum N         and never below a pollen sum of N

Exotic marker spike (for concentration; recorded in FILE)
  --tablets T         marker tablets added to the sample
  --per-tablet S      the batch's mean marker spores per tablet
  --per-tablet-sd SD  the batch's standard deviation per tablet
  --volume V | --mass G   sample volume in cm³, or mass in g
  --accumulation-rate R   sediment accumulation in cm/yr, for influx

Keys
  taxon keys count one grain each; Backspace undoes the last grain (right after
  a Tab: the traverse change); Tab starts the next traverse; ' then a taxon key
  counts a cf. grain (probable, not certain); Enter writes a note on the last
  grain ("@12.4,88.1 cf. Tilia" records the stage position); = adds a type
  that is not in the keymap ("Ilex aquifolium, shrubs") and counts it; ? shows
  the keymap (the keymap may move these); Ctrl-F then y marks the level
  finished and quits; Ctrl-C quits (every grain is on disk already).
  When the stop rules are met the screen says STOP RULES MET and rings three
  bells; counting goes on until you finish.

Examples
  exine count km1-112cm.jsonl --core KM-1 --depth 112 --slide KM1-112-A
  exine count km1-112cm.jsonl          (resume the next day)
  exine count km1-136cm.jsonl --precision 3 --precision-share 5 --min-sum 300 \\
      --tablets 1 --per-tablet 12500 --per-tablet-sd 420 --volume 1
  exine count km1-112cm.jsonl --target 300   (lower the target on resume)`,
  demo: `Usage
  exine demo

Copies the demo core (demo-sessions/: core.json and every level) into your
demo folder under the temporary folder (exine-demo-USER) and opens its
half-counted level for counting. Each run starts from a fresh copy, replacing
the last one. On exit it prints the copy's path and the command for the core
view of the copy. The bundled demo files are never changed.`,
  audit: `Usage
  exine audit FILE [--plain] [--double-press MS] [--gap MIN]

Reviews how a level was counted: a table of traverses (start, time, grains,
types, grains per minute, new types, undos, voids, notes), each traverse's
grains by taxon and its events, the sittings and pauses, a χ² test of whether
the types are spread alike across traverses, presses to review, corrections,
and the file's integrity. Reads the file without a lock: it works while the
level is being counted elsewhere, and follows it as it grows.

Keys: ↑ ↓ select · Tab switches between traverses and their grains ·
v voids the selected traverse or grain (asks for a reason) · r restores it ·
f shows sittings, flags and corrections · q quits. A void or restore is a new
event: the grains stay in the file. Corrections wait while the level is open
in exine count.

Options
  --plain            print the audit as a text report and exit
  --double-press MS  flag the same key twice within MS ms (default 120)
  --gap MIN          a pause is longer than MIN minutes (default 5)
  -h, --help         this help`,
  summary: `Usage
  exine summary FILE [--json] [--rarefy N …]

Prints the level's statistics and the state of its stop rules: counts,
percentages with 95% intervals (Wilson, Clopper–Pearson exact, Sison–Glaz
simultaneous), sample coverage, Chao1 richness, rarefaction, and marker
concentration with influx when spike data is recorded. Reads the file without
changing it.

Options
  --json       one JSON object instead of text
  --rarefy N   expected types among N grains of the sum (Hurlbert 1971), with
               its standard error; give it more than once for several N
  -h, --help   this help`,
  export: `Usage
  exine export FILE… [--format long|wide|notes] [--out PATH] [--force]
  exine export DIR [--values counts|percent] [--format wide|long|notes|taxa] …

Writes levels as CSV (RFC 4180, UTF-8, header row). long: one row per level
and taxon, with percentages, intervals and marker concentration. wide: one row
per level, one count column per taxon, levels in depth order. notes: one row
per note, with the grain's taxon, traverse and stage position.

A core folder DIR exports as the core's matrix (wide, the default there): each
level's status, slides, markers, summary groups and taxa, synonyms merged; the
taxa and their groups go to NAME.taxa.csv beside --out NAME.csv (--format taxa
prints them). It refuses a level of another core, a level not finished or not
meeting its rules, and the same session twice, naming the files.

Options
  --format F  long (default for files), wide, notes, or taxa (a core)
  --values V  counts (default) or percent of the pollen sum (a core's matrix)
  --include-unfinished  a core: export levels not finished or not met too
  --mixed-cores         export levels of other cores too
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
  prefs: `Usage
  exine prefs                  show every preference, its value and whether
                               it is set
  exine prefs set NAME VALUE   set one
  exine prefs unset NAME       back to the default
  exine prefs path             where they are stored

Preferences
  bell      on | off      terminal bells: one for a new type, three when the
                          stop rules are met, one for a break (default on)
  rare      N             types with at most N grains are listed as rare (2)
  break     MIN | off     remind to rest the eyes after MIN minutes of a
                          sitting (default 50; common practice for long
                          microscope work)
  keymap    NAME | PATH   keymap for new levels (temperate-lowland)
  analyst   NAME | off    recorded as the analyst of new levels

Flags of exine count override preferences; preferences override the defaults.

Examples
  exine prefs set analyst "R. Fern"
  exine prefs set break off`,
  core: `Usage
  exine core init DIR --site S --core C [options]
  exine core DIR [--plain | --json]

init makes DIR (or uses an empty one) a core folder: DIR/core.json holds the
site and core names, a copy of the keymap, the default stop rules, the marker
batch and the planned depths. Levels counted with exine count DIR --depth D
inherit them. core.json may be edited by hand; every command checks it again.

Options of init
  --site S, --core C  names recorded in every level (required)
  --keymap PATH|NAME  keymap copied into core.json (default: the keymap
                      preference)
  --depths A:B:STEP | D1,D2,…  planned depths, e.g. 4:200:8
  --target, --precision, --coverage, --plateau, --markers, --conc-error,
  --rule-mode, --min-sum   default stop rules, as for exine count
  --tablets T --per-tablet S [--per-tablet-sd SD]   the marker batch
                      (volume or mass is per level: give it to exine count)
  -h, --help          this help

exine core DIR shows every level, planned ones too: status, pollen sum and
grains still needed, squared-chord distance to the level above, time,
integrity, and strips of the commonest taxa. ? marks a level unlike both its
neighbours, ◂ the planned depth to count next. ↑↓ select, Enter counts the
level (Ctrl-C there comes back), q quits. The view follows files that change.
  --plain             the same as text        --json   everything, for a script
  --quiet             no bells in the counting screen`,
  keys: `Usage
  exine keys PATH|NAME
  exine keys PATH|NAME --card card.svg|card.txt [--paper a4|letter] [--force]
  exine keys new FILE [--name NAME] [--force]
  exine keys edit FILE
  exine keys from-list LIST --out FILE [--name NAME] [--force]
  exine keys PATH --add-types SESSION

Checks a keymap file and draws its layout. NAME is a bundled keymap
(temperate-lowland, keypad).

--card writes a key card to print and keep beside the microscope: an SVG
drawing (A4 or Letter, landscape) or plain text.

new makes a keymap at the keyboard: press a key, type the taxon, Enter, type
its group (a few letters; Enter alone repeats the last; a new name makes a
group of your own and asks its role). Enter on an empty taxon saves and ends.
edit changes a keymap file in place, keeping its layout (a used key: type a new
taxon, or "-" to free it).

from-list makes a keymap from a taxon list, one "taxon, group" a line (a third
field gives a new group's role: sum, outside, marker, indeterminable), or a CSV
with columns taxon and group (and role). Keys: the taxon's initial when free,
else its second letter, else the next free key after the initial (then digits,
signs, capitals); the report says which taxon got which key and why.

With --add-types, the types added while counting SESSION (the = key) are
written into your keymap file on the keys they had, so the next level starts
with them. The file keeps its layout; a bundled keymap is never changed (copy
it first).

Examples
  exine keys keypad --card keypad-card.svg
  exine keys new mire.json
  exine keys from-list taxa.csv --out mire.json
  cp keymaps/temperate-lowland.json km1-keys.json
  exine keys km1-keys.json --add-types km1-084cm.jsonl`,
};
