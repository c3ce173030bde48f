#!/usr/bin/env node
// Placeholder entry; the CLI issue wires the commands here.
console.log('sinecheck: commands arrive with the CLI issue');
