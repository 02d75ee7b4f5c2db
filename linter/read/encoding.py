"""Which text encoding a file is in: byte order marks first, strict UTF-8 next, then a guess."""

from __future__ import annotations

import codecs
from dataclasses import dataclass

from charset_normalizer import from_bytes

from linter.read.errors import UnreadableFile
from linter.read.sniff import looks_like_utf16
from linter.table import ReadNote

CHUNK_BYTES = 1 << 20
GUESS_SAMPLE_BYTES = 256 * 1024

# Source: The Unicode Standard §23.8 (byte order mark): EF BB BF, FF FE, FE FF.
BOMS: tuple[tuple[bytes, str, str], ...] = (
    (codecs.BOM_UTF8, "utf-8-sig", "UTF-8 with a byte order mark"),
    (codecs.BOM_UTF16_LE, "utf-16", "UTF-16 little-endian"),
    (codecs.BOM_UTF16_BE, "utf-16", "UTF-16 big-endian"),
)


@dataclass(frozen=True)
class Decoding:
    """How to decode a text file, and what the choice says about the file."""

    encoding: str
    """Python codec name to open the file with (the BOM, if any, is dropped by the codec)."""
    notes: tuple[ReadNote, ...] = ()


def first_invalid_utf8(path: str) -> tuple[int, bool] | None:
    """Offset of the first byte that is not UTF-8, and whether valid non-ASCII UTF-8 came before it.

    Reads in chunks, so a huge file costs no more memory than one chunk.
    """
    decoder = codecs.getincrementaldecoder("utf-8")("strict")
    offset = 0
    seen_multibyte = False
    with open(path, "rb") as handle:
        while chunk := handle.read(CHUNK_BYTES):
            try:
                decoder.decode(chunk)
            except UnicodeDecodeError as error:
                seen_multibyte = seen_multibyte or any(b >= 0x80 for b in chunk[: error.start])
                return offset + error.start, seen_multibyte
            seen_multibyte = seen_multibyte or any(b >= 0x80 for b in chunk)
            offset += len(chunk)
        try:
            decoder.decode(b"", final=True)
        except UnicodeDecodeError:
            return offset, seen_multibyte
    return None


def decodes_whole_file(path: str, encoding: str) -> bool:
    decoder = codecs.getincrementaldecoder(encoding)("strict")
    try:
        with open(path, "rb") as handle:
            while chunk := handle.read(CHUNK_BYTES):
                decoder.decode(chunk)
            decoder.decode(b"", final=True)
    except UnicodeDecodeError:
        return False
    return True


def display_name(encoding: str) -> str:
    names = {"cp1252": "Windows-1252", "latin_1": "Latin-1 (ISO 8859-1)", "iso8859_15": "Latin-9"}
    return names.get(encoding, encoding.replace("_", "-"))


def guessed_encoding(sample: bytes) -> str | None:
    """charset-normalizer's best guess for bytes that are not UTF-8 (None when it cannot tell)."""
    best = from_bytes(sample).best()
    if best is None:
        return None
    return str(best.encoding)


def choose_decoding(path: str, head: bytes) -> Decoding:
    """Decide how to decode `path`; raise UnreadableFile when no encoding fits."""
    for bom, encoding, label in BOMS:
        if head.startswith(bom):
            if encoding == "utf-8-sig":
                note = ReadNote("byte-order-mark", "The file starts with a UTF-8 byte order mark.")
                if first_invalid_utf8(path) is None:
                    return Decoding(encoding, (note,))
                break
            return Decoding(
                encoding,
                (ReadNote("encoding", f"The file is encoded as {label}, not UTF-8.", examples=(label,)),),
            )
    if looks_like_utf16(head):
        # ASCII text with a NUL beside every character is UTF-16 that lost (or never had) its BOM;
        # NULs in the even bytes mean the high byte comes first (big-endian).
        encoding = "utf-16-be" if head[0::2].count(0) > head[1::2].count(0) else "utf-16-le"
        if decodes_whole_file(path, encoding):
            order = "big" if encoding.endswith("be") else "little"
            label = f"UTF-16 {order}-endian without a byte order mark"
            return Decoding(
                encoding,
                (ReadNote("encoding", f"The file is encoded as {label}, not UTF-8.", examples=(label,)),),
            )
    invalid = first_invalid_utf8(path)
    if invalid is None:
        return Decoding("utf-8")
    offset, mixed = invalid
    with open(path, "rb") as handle:
        handle.seek(max(0, offset - GUESS_SAMPLE_BYTES // 2))
        sample = handle.read(GUESS_SAMPLE_BYTES)
    guess = guessed_encoding(sample)
    # A guess of UTF-8 (or none) for bytes that failed strict UTF-8 means the detector could
    # not tell; Windows-1252 is then the most common culprit in partner files.
    candidates = [c for c in (guess, "cp1252") if c and c.replace("-", "_") not in {"utf_8", "ascii"}]
    for candidate in candidates:
        if decodes_whole_file(path, candidate):
            name = display_name(candidate)
            bad = head[offset : offset + 8] if offset < len(head) else sample[:8]
            notes = [
                ReadNote(
                    "encoding",
                    f"The file is not UTF-8 (first non-UTF-8 byte at offset {offset}); "
                    f"it was read as {name}.",
                    examples=(name, bad.decode(candidate, errors="replace")),
                )
            ]
            if mixed:
                notes.append(
                    ReadNote(
                        "mixed-encoding",
                        "Part of the file is valid UTF-8 and part is not: it was probably pasted "
                        f"together from files saved differently. It was read as {name}, so the UTF-8 "
                        "parts may show as two odd characters each (e.g. 'Ã©' for 'é').",
                    )
                )
            return Decoding(candidate, tuple(notes))
    raise UnreadableFile(
        "file.encoding-unknown",
        f"The file's text encoding cannot be recognised (the first byte that is not UTF-8 is at "
        f"offset {offset}).",
        "Open the file in the program that made it and save it as CSV UTF-8.",
    )
