#include "report/picture_check.h"

#include <doctest/doctest.h>

#include <cstdint>
#include <string>

namespace hushgain {
namespace {

// CRC-32 as the PNG specification computes it (ISO/IEC 15948, annex D:
// polynomial 0xEDB88320 reflected, register preset to all ones and
// inverted at the end), over the chunk type and data.
std::uint32_t Crc32(const std::string& bytes) {
  std::uint32_t c = 0xFFFFFFFFu;
  for (unsigned char b : bytes) {
    c ^= b;
    for (int k = 0; k < 8; ++k) c = (c & 1) ? 0xEDB88320u ^ (c >> 1) : c >> 1;
  }
  return c ^ 0xFFFFFFFFu;
}

// A chunk: 4-byte big-endian length, type, data, CRC (section 5.3).
std::string Chunk(const std::string& type, const std::string& data) {
  auto be32 = [](std::uint32_t v) {
    return std::string{static_cast<char>(v >> 24), static_cast<char>(v >> 16),
                       static_cast<char>(v >> 8), static_cast<char>(v)};
  };
  return be32(static_cast<std::uint32_t>(data.size())) + type + data +
         be32(Crc32(type + data));
}

// The checker reads only the two ends, as OutputFiles gives them.
std::string Check(PlotFormat format, const std::string& file) {
  const std::size_t tail = std::min(file.size(), kPictureTailBytes);
  return IncompletePicture(format, file.substr(0, kPictureHeadBytes),
                           file.substr(file.size() - tail));
}

TEST_CASE("a png is whole from its signature to its iend chunk") {
  // Signature: section 5.2. The IEND chunk, built here with its CRC,
  // must be the last 12 bytes (section 11.2.5).
  const std::string signature("\x89PNG\r\n\x1A\n", 8);
  const std::string png = signature + Chunk("IHDR", std::string(13, '\1')) +
                          Chunk("IDAT", std::string(3000, 'x')) +
                          Chunk("IEND", "");
  CHECK(Check(PlotFormat::kPng, png) == "");
  // What a full disk leaves: the file cut anywhere before its end.
  CHECK(Check(PlotFormat::kPng, png.substr(0, png.size() - 1)) ==
        "no IEND chunk at its end");
  CHECK(Check(PlotFormat::kPng, png.substr(0, 2000)) ==
        "no IEND chunk at its end");
  CHECK(Check(PlotFormat::kPng, png.substr(0, 5)) ==
        "no PNG signature at its start");
  CHECK(Check(PlotFormat::kPng, "") == "empty");
  // An IEND chunk with a wrong CRC is no end.
  std::string bad_crc = png;
  bad_crc.back() ^= 1;
  CHECK(Check(PlotFormat::kPng, bad_crc) == "no IEND chunk at its end");
}

TEST_CASE("an svg is whole when its root element is closed") {
  const std::string svg =
      "<?xml version=\"1.0\"?>\n<svg width=\"10\" height=\"10\">\n"
      "<g><path d=\"M0 0 L10 10\"/></g>\n</svg>\n\n";
  CHECK(Check(PlotFormat::kSvg, svg) == "");
  CHECK(Check(PlotFormat::kSvg, svg.substr(0, svg.find("</svg>"))) ==
        "no closing </svg> tag at its end");
  CHECK(Check(PlotFormat::kSvg, "") == "empty");
}

TEST_CASE("a pdf is whole from its header to its end-of-file marker") {
  // ISO 32000-1 sections 7.5.2 (header) and 7.5.5 (the last line %%EOF).
  const std::string pdf =
      "%PDF-1.5\n1 0 obj\n<< >>\nendobj\ntrailer\n<< >>\nstartxref\n9\n"
      "%%EOF\n";
  CHECK(Check(PlotFormat::kPdf, pdf) == "");
  CHECK(Check(PlotFormat::kPdf, pdf.substr(0, pdf.size() - 4)) ==
        "no %%EOF trailer at its end");
  CHECK(Check(PlotFormat::kPdf, "<html>" + pdf.substr(8)) ==
        "no %PDF- header at its start");
}

}  // namespace
}  // namespace hushgain
