const c0 = process.cpuUsage(); const t0 = performance.now();
const lap = (n) => { const c = process.cpuUsage(c0); console.log(n.padEnd(28), (performance.now() - t0).toFixed(1), ((c.user + c.system) / 1000).toFixed(1)); };
for (const m of process.argv.slice(2)) { await import(m); lap(m.replace(/.*\/dist\//, "")); }
