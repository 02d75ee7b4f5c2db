"""The data dictionary: a contract told in plain words, as printable HTML or Markdown."""
