/**
 * The text the virtual clients save: a Strainlab differential stage with a mirrored tail and an
 * RC ladder on its output, about 4 kB, as a designer's netlist is a few kB. Each save changes a
 * counter in a comment and a load value, so every revision differs from the one before.
 */

const LADDER_SECTIONS = 40;

export function netlistText(client: number, save: number, label: string): string {
  const lines = [
    `title  Strainlab front end, load client ${client}: mirrored tail with an output ladder`,
    `# ${label}: save ${save} of client ${client} (written by npm run load)`,
    '# The ladder stands in for the wiring a layout extraction adds after the stage.',
    '',
    'param  rc   = 8k',
    'param  rref = 9.3k                      # (10 V - VBE)/rref = 1 mA reference',
    'param  rg   = 350',
    `param  cl   = ${(2 + (save % 50) / 10).toFixed(1)}p                     # load under study`,
    '',
    'model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)',
    '',
    'vcc:   vsrc(vcc, gnd) 10 V',
    'va:    vsrc(bra, gnd) 2.5 V ac=1',
    'vb:    vsrc(brb, gnd) 2.5 V',
    'rga:   res(bra, ina) rg',
    'rgb:   res(brb, inb) rg',
    'q1:    npn(c=outa, b=ina, e=tail) qn',
    'q2:    npn(c=outb, b=inb, e=tail) qn',
    'rca:   res(vcc, outa) rc',
    'rcb:   res(vcc, outb) rc',
    'rref:  res(vcc, bias) rref',
    'qr:    npn(c=bias, b=bias, e=gnd) qn',
    'qt:    npn(c=tail, b=bias, e=gnd) qn',
    '',
  ];
  for (const side of ['a', 'b']) {
    let from = `out${side}`;
    for (let i = 1; i <= LADDER_SECTIONS / 2; i++) {
      const to = `l${side}${i}`;
      lines.push(`rl${side}${i}:`.padEnd(7) + `res(${from}, ${to}) ${10 + i}`.padEnd(28) + `# section ${i} of side ${side}`);
      lines.push(`cl${side}${i}:`.padEnd(7) + `cap(${to}, gnd) cl`);
      from = to;
    }
  }
  lines.push(
    '',
    'ports   in=(va, vb) out=(la20, lb20)',
    'analyze ac from 10 Hz to 1 GHz per decade 20',
    '',
    'measure a0    = db(adm)',
    'measure f3    = corner(adm)',
    'measure itail = ic(qt)',
    'check   itail = 1m ± 10%',
    'check   vce(qt) > 0.5                   # tail transistor stays out of saturation',
    'check   a0 >= 40',
    '',
  );
  return lines.join('\n');
}
