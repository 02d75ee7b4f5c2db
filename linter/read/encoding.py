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
    # UTF-32 first: its little-endian mark FF FE 00 00 begins with UTF-16's FF FE.
    (codecs.BOM_UTF32_LE, "utf-32", "UTF-32 little-endian"),
    (codecs.BOM_UTF32_BE, "utf-32", "UTF-32 big-endian"),
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
                seen_multibyte = seen_multibyte or not chunk[: error.start].isascii()
                return offset + error.start, seen_multibyte
            seen_multibyte = seen_multibyte or not chunk.isascii()
            offset += len(chunk)
        try:
            decoder.decode(b"", final=True)
        except UnicodeDecodeError:
            return offset, seen_multibyte
    return None


def line_of(path: str, offset: int) -> int:
    """The 1-based physical line holding byte `offset` (CR, LF and CRLF each end a line)."""
    breaks = 0
    previous = b""
    with open(path, "rb") as handle:
        left = offset
        while left > 0 and (chunk := handle.read(min(CHUNK_BYTES, left))):
            left -= len(chunk)
            joined = previous + chunk
            # A CRLF split over two reads is counted once: the CR is held back until the next read.
            body = joined[:-1] if joined.endswith(b"\r") else joined
            breaks += body.count(b"\n") + body.count(b"\r") - body.count(b"\r\n")
            previous = joined[len(body) :]
    if previous:  # a CR just before the offset ends its line
        breaks += 1
    return breaks + 1


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


def single_byte_text(sample: bytes) -> bool:
    """True when most non-ASCII bytes stand alone between ASCII ones, as accented letters do.

    Multi-byte encodings (UTF-8, Big5, Shift JIS...) put non-ASCII bytes in runs of two or
    more; a detector shown a mostly-ASCII file with one `ü` (byte FC) may still guess Big5.
    """
    # Common practice (no source): in Western single-byte text, accented letters are isolated.
    high = [i for i, b in enumerate(sample) if b >= 0x80]
    if not high:
        return False
    alone = sum(
        1 for i in high if (i == 0 or sample[i - 1] < 0x80) and (i + 1 == len(sample) or sample[i + 1] < 0x80)
    )
    return alone * 2 > len(high)


SINGLE_BYTE_PAGES = ["cp1252", "cp1250", "cp1257", "iso8859_15", "latin_1", "mac_roman", "cp850"]
"""Code pages tried for text whose non-ASCII bytes stand alone (accented Latin letters)."""


def guessed_encoding(sample: bytes) -> str | None:
    """charset-normalizer's best guess for bytes that are not UTF-8 (None when it cannot tell).

    When the detector ranks Windows-1252 equal to its best guess, or the best guess reads the
    very same characters as Windows-1252 (e.g. Windows-1250 for German text), Windows-1252 is
    named: it is the code page Western spreadsheets save in.
    """
    isolation = SINGLE_BYTE_PAGES if single_byte_text(sample) else None
    matches = list(from_bytes(sample, cp_isolation=isolation))
    if not matches:
        return None
    best = matches[0]
    tied = {str(m.encoding) for m in matches if (m.chaos, m.coherence) == (best.chaos, best.coherence)}
    if "cp1252" in tied:
        return "cp1252"
    guess = str(best.encoding)
    try:
        if sample.decode("cp1252") == sample.decode(guess):
            return "cp1252"
    except (UnicodeDecodeError, LookupError):
        pass
    return guess


def choose_decoding(path: str, head: bytes) -> Decoding:
    """Decide how to decode `path`; raise UnreadableFile when no encoding fits."""
    for bom, encoding, label in BOMS:
        if head.startswith(bom):
            if encoding == "utf-8-sig":
                note = ReadNote("byte-order-mark", "The file starts with a UTF-8 byte order mark.")
                if first_invalid_utf8(path) is None:
                    return Decoding(encoding, (note,))
                break
            if decodes_whole_file(path, encoding):
                return Decoding(
                    encoding,
                    (ReadNote("encoding", f"The file is encoded as {label}, not UTF-8.", examples=(label,)),),
                )
            break  # bytes FF FE or FE FF that do not go on as UTF-16: judge them like any other
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
    sample_start = max(0, offset - GUESS_SAMPLE_BYTES // 2)
    with open(path, "rb") as handle:
        handle.seek(sample_start)
        sample = handle.read(GUESS_SAMPLE_BYTES)
    guess = guessed_encoding(sample)
    # A guess of UTF-8 (or none) for bytes that failed strict UTF-8 means the detector could
    # not tell; Windows-1252 is then the most common culprit in partner files.
    candidates = [c for c in (guess, "cp1252") if c and c.replace("-", "_") not in {"utf_8", "ascii"}]
    for candidate in candidates:
        if decodes_whole_file(path, candidate):
            name = display_name(candidate)
            at = offset - sample_start
            around = sample[max(0, at - 12) : at + 12].decode(candidate, errors="replace")
            snippet = " ".join(around.split())
            line = line_of(path, offset)
            notes = [
                ReadNote(
                    "encoding",
                    f"The file is not UTF-8 (the first character UTF-8 cannot read is on line {line}, "
                    f"in {snippet!r}); it was read as {name}.",
                    rows=(line,),
                    examples=(name, snippet),
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
