#!/usr/bin/env node
console.log('bin ok', process.argv.slice(2).join(' '));
