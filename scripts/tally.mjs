// Adds up the results of every suite that scripts/test.sh ran and prints the closing line
// `N passed, N failed`. Inputs: a folder of Jest/Vitest JSON reports (*.json) and check results (*.check).
import fs from 'node:fs';
import path from 'node:path';

const dir = process.argv[2];
let passed = 0;
let failed = 0;
const rows = [];
const failures = []; // "suite: file > test title" of every failed test, so a CI log names what failed
for (const name of fs.readdirSync(dir).sort()) {
  const file = path.join(dir, name);
  const suite = name.replace(/\.(json|check)$/, '');
  if (name.endsWith('.check')) {
    const ok = fs.readFileSync(file, 'utf8').trim() === 'pass';
    if (ok) passed++;
    else failed++;
    rows.push([suite, ok ? 1 : 0, ok ? 0 : 1]);
  } else if (name.endsWith('.json')) {
    let p;
    let f;
    try {
      const r = JSON.parse(fs.readFileSync(file, 'utf8'));
      p = r.numPassedTests ?? 0;
      f = (r.numFailedTests ?? 0) + (r.numRuntimeErrorTestSuites ?? 0);
      if (r.success === false && f === 0) f = 1;
      for (const file of r.testResults ?? []) {
        const where = path.relative(process.cwd(), file.name ?? file.testFilePath ?? '?');
        const failedTests = (file.assertionResults ?? []).filter((t) => t.status === 'failed');
        for (const t of failedTests) failures.push(`${suite}: ${where} > ${t.fullName ?? t.title}`);
        if (!failedTests.length && file.status === 'failed')
          failures.push(
            `${suite}: ${where} (${(file.message ?? 'suite failed').split('\n')[0].slice(0, 200)})`,
          );
      }
    } catch {
      p = 0;
      f = 1;
    }
    passed += p;
    failed += f;
    rows.push([suite, p, f]);
  }
}
console.log('\nSuite results:');
for (const [suite, p, f] of rows)
  console.log(`  ${f ? 'FAIL' : 'ok  '} ${suite.padEnd(28)} ${p} passed, ${f} failed`);
if (failures.length) {
  console.log('\nFailed:');
  for (const f of failures) console.log(`  ${f}`);
}
console.log(`\n${passed} passed, ${failed} failed`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
