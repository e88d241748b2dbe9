"""Minimal PDF files written by hand for the safety-data-sheet tests.

pypdf reads PDFs but cannot lay text out easily, so the tests write the few
objects a one-font text PDF needs (PDF 1.4, ISO 32000-1 sections 7.5 and 9):
a catalog, a page tree, pages with a Helvetica font in WinAnsiEncoding (which
holds the degree sign), and content streams that show one line after another.
"""

from __future__ import annotations


def _escape(line: str) -> bytes:
    data = line.encode("cp1252", "replace")
    return data.replace(b"\\", b"\\\\").replace(b"(", b"\\(").replace(b")", b"\\)")


def _assemble(objects: list[bytes]) -> bytes:
    out = bytearray(b"%PDF-1.4\n%\xe2\xe3\xcf\xd3\n")
    offsets = []
    for number, body in enumerate(objects, 1):
        offsets.append(len(out))
        out += f"{number} 0 obj\n".encode() + body + b"\nendobj\n"
    xref = len(out)
    out += f"xref\n0 {len(objects) + 1}\n0000000000 65535 f \n".encode()
    for offset in offsets:
        out += f"{offset:010d} 00000 n \n".encode()
    out += (f"trailer\n<< /Size {len(objects) + 1} /Root 1 0 R >>\nstartxref\n{xref}\n"
            "%%EOF\n").encode()
    return bytes(out)


def _stream(content: bytes) -> bytes:
    return f"<< /Length {len(content)} >>\nstream\n".encode() + content + b"\nendstream"


def text_pdf(text: str, lines_per_page: int = 60) -> bytes:
    """A PDF whose text layer holds `text`, one line per text line."""
    lines = text.splitlines() or [""]
    pages = [lines[i:i + lines_per_page] for i in range(0, len(lines), lines_per_page)]
    n = len(pages)
    # objects: 1 catalog, 2 pages, 3 font, then (page, content) per page
    kids = " ".join(f"{4 + 2 * i} 0 R" for i in range(n))
    objects = [b"<< /Type /Catalog /Pages 2 0 R >>",
               f"<< /Type /Pages /Kids [{kids}] /Count {n} >>".encode(),
               b"<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica "
               b"/Encoding /WinAnsiEncoding >>"]
    for i, page in enumerate(pages):
        content = bytearray(b"BT /F1 9 Tf 11 TL 40 760 Td\n")
        for line in page:
            content += b"(" + _escape(line) + b") Tj T*\n"
        content += b"ET"
        objects.append(f"<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] "
                       f"/Resources << /Font << /F1 3 0 R >> >> /Contents {5 + 2 * i} 0 R >>"
                       .encode())
        objects.append(_stream(bytes(content)))
    return _assemble(objects)


def image_only_pdf() -> bytes:
    """A one-page PDF with a drawn picture and no text, like a scanned sheet."""
    image = bytes(range(256)) * 3  # 16 x 16 RGB
    objects = [b"<< /Type /Catalog /Pages 2 0 R >>",
               b"<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
               b"<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] "
               b"/Resources << /XObject << /Im1 5 0 R >> >> /Contents 4 0 R >>",
               _stream(b"q 500 0 0 700 50 50 cm /Im1 Do Q"),
               b"<< /Type /XObject /Subtype /Image /Width 16 /Height 16 /ColorSpace "
               b"/DeviceRGB /BitsPerComponent 8 /Length " + str(len(image)).encode()
               + b" >>\nstream\n" + image + b"\nendstream"]
    return _assemble(objects)
