// Spools an upload that never ends into the folder given as argv[2], for the test that kills an import mid-way.
// Run it as `node --import tsx` (not the tsx CLI) so that the pid the test holds is the one in the folder name.
import { spool } from '../../lib/import/spool';

async function* endless(): AsyncGenerator<Uint8Array> {
  const line = new TextEncoder().encode('Si,frequency,520,cm-1,,300,azuhata1995\n');
  for (let i = 0; ; i++) {
    yield line;
    if (i === 50) process.stdout.write('spooling\n');
    await new Promise((r) => setTimeout(r, 5));
  }
}

void spool(endless(), process.argv[2]);
