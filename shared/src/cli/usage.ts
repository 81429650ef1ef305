/** The text of `spanledger --help`: only the commands this version has. */
export const USAGE = `Usage: spanledger <command> [arguments]

Commands:
  capacity FILE.json   flexural strength of one girder section, from a calculation file
  capacity -           the same, reading the calculation file from standard input
  rate FILE.json       LRFR load rating of one girder line on a simple span
  rate -               the same, from standard input

Options:
  -h, --help           show this help

The result is one JSON document on standard output. Exit status: 0 done,
2 bad input (each offending path on standard error), 1 any other failure
(set SPANLEDGER_DEBUG=1 to see its stack). The file format: docs/calc-file.md.
`;
