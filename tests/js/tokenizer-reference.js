// Reference counts for tokenizer.json files, from the Rust reference tokenizers library (npm @anush008/tokenizers,
// installed by .ci/run). RANKFREQ_TOKENIZERS names the node_modules folder that holds it.
//
//   node tokenizer-reference.js count TOKENIZER.json jsonl|text|lines FILE...   per-id counts ("id count" lines,
//        after a "total N" line); jsonl: one document per record (field "text"), text: each file one document,
//        lines: each line of each file one document (the line break not included)
//   node tokenizer-reference.js ids TOKENIZER.json FILE.jsonl    each record's ids, one line per record
//   node tokenizer-reference.js count-specials TOKENIZER.json FORMAT FILE...   as count, but with special-token
//        parsing: special added tokens written in the text encode as their ids (only the post-processor is dropped)
//   node tokenizer-reference.js train unigram|wordpiece CORPUS.txt OUT.json    trains a small model
//
// Documents are encoded without special tokens, and special added tokens are made unmatchable first (and the
// post-processor dropped), so that special-token text in a corpus counts as ordinary text, as RankFreq counts it.
'use strict';
const fs = require('fs');
const os = require('os');
const path = require('path');

const modules = process.env.RANKFREQ_TOKENIZERS;
if (!modules) { console.error('RANKFREQ_TOKENIZERS is not set'); process.exit(2); }
const tk = require(path.join(modules, '@anush008', 'tokenizers'));

function loadAsText(file, keepSpecials = false) {
  const j = JSON.parse(fs.readFileSync(file, 'utf8'));
  // special tokens keep their place (removing them would renumber later added tokens) under a content that never
  // occurs in text: two Unicode noncharacters around a name
  for (const a of j.added_tokens || []) if (a.special && !keepSpecials) { a.content = `\uFDD0rankfreq special ${a.id}\uFDD1`; a.normalized = false; }
  j.post_processor = null;
  const tmp = path.join(os.tmpdir(), `rankfreq-ref-${process.pid}.json`);
  fs.writeFileSync(tmp, JSON.stringify(j));
  try { return tk.Tokenizer.fromFile(tmp); } finally { fs.unlinkSync(tmp); }
}

function documents(format, files) {
  const docs = [];
  for (const f of files) {
    const text = fs.readFileSync(f, 'utf8');
    if (format === 'text') docs.push(text);
    else if (format === 'lines') for (const l of text.split(/\r?\n/)) docs.push(l);
    else if (format === 'jsonl') {
      for (const line of text.split('\n')) {
        if (line.trim() === '') continue;
        const r = JSON.parse(line);
        if (typeof r.text === 'string') docs.push(r.text);
      }
    } else throw new Error(`unknown format ${format}`);
  }
  return docs;
}

async function count(tokFile, format, files, keepSpecials = false) {
  const t0 = process.hrtime.bigint();
  const tok = loadAsText(tokFile, keepSpecials);
  const docs = documents(format, files);
  const counts = new Map();
  let total = 0;
  const batch = 4096;
  for (let i = 0; i < docs.length; i += batch) {
    const enc = await tok.encodeBatch(docs.slice(i, i + batch), { addSpecialTokens: false });
    for (const e of enc) for (const id of e.getIds()) { counts.set(id, (counts.get(id) || 0) + 1); total++; }
  }
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const out = [`total ${total}`];
  for (const id of [...counts.keys()].sort((a, b) => a - b)) out.push(`${id} ${counts.get(id)}`);
  process.stdout.write(out.join('\n') + '\n');
  console.error(`reference: ${docs.length} documents, ${total} tokens, ${ms.toFixed(0)} ms (load included)`);
}

async function ids(tokFile, file) {
  const tok = loadAsText(tokFile);
  const docs = documents('jsonl', [file]);
  const enc = await tok.encodeBatch(docs, { addSpecialTokens: false });
  process.stdout.write(enc.map(e => e.getIds().join(' ')).join('\n') + '\n');
}

function train(kind, corpus, out) {
  let tok;
  if (kind === 'unigram') {
    tok = new tk.Tokenizer(tk.Unigram.empty());
    tok.setNormalizer(tk.sequenceNormalizer([tk.nfkcNormalizer(), tk.replace('  ', ' ')]));
    tok.setPreTokenizer(tk.metaspacePreTokenizer('▁', 'first'));
  } else if (kind === 'wordpiece') {
    tok = new tk.Tokenizer(tk.WordPiece.empty());
    tok.setNormalizer(tk.bertNormalizer({ lowercase: true, stripAccents: true, cleanText: true }));
    tok.setPreTokenizer(tk.sequencePreTokenizer([tk.whitespacePreTokenizer(), tk.digitsPreTokenizer(true)]));
  } else throw new Error(`unknown model kind ${kind}`);
  tok.train([corpus]);
  tok.save(out, false);
  // the trainers' defaults give no unknown token; add one so characters unseen in training encode
  const j = JSON.parse(fs.readFileSync(out, 'utf8'));
  if (kind === 'unigram') { j.model.vocab.unshift(['<unk>', 0]); j.model.unk_id = 0; }
  else if (!('[UNK]' in j.model.vocab)) j.model.vocab['[UNK]'] = Object.keys(j.model.vocab).length;
  fs.writeFileSync(out, JSON.stringify(j));
}

const [cmd, ...args] = process.argv.slice(2);
if (cmd === 'count' || cmd === 'count-specials')
  count(args[0], args[1], args.slice(2), cmd === 'count-specials').catch(e => { console.error(e); process.exit(1); });
else if (cmd === 'ids') ids(args[0], args[1]).catch(e => { console.error(e); process.exit(1); });
else if (cmd === 'train') train(args[0], args[1], args[2]);
else { console.error('usage: tokenizer-reference.js count|train ...'); process.exit(2); }
