#include "report/picture_check.h"

namespace hushgain {
namespace {

bool EndsWith(std::string_view text, std::string_view suffix) {
  return text.size() >= suffix.size() &&
         text.substr(text.size() - suffix.size()) == suffix;
}

std::string_view TrimEnd(std::string_view text) {
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t' ||
                           text.back() == '\r' || text.back() == '\n'))
    text.remove_suffix(1);
  return text;
}

}  // namespace

std::string IncompletePicture(PlotFormat format, std::string_view head,
                              std::string_view tail) {
  if (head.empty()) return "empty";
  switch (format) {
    case PlotFormat::kPng: {
      static constexpr char kSignature[] = "\x89PNG\r\n\x1A\n";
      static constexpr char kIend[] =
          "\x00\x00\x00\x00IEND\xAE\x42\x60\x82";  // length 0, type, CRC
      if (!head.starts_with(std::string_view(kSignature, 8)))
        return "no PNG signature at its start";
      if (!EndsWith(tail, std::string_view(kIend, 12)))
        return "no IEND chunk at its end";
      return "";
    }
    case PlotFormat::kSvg:
      if (!EndsWith(TrimEnd(tail), "</svg>"))
        return "no closing </svg> tag at its end";
      return "";
    case PlotFormat::kPdf:
      if (!head.starts_with("%PDF-")) return "no %PDF- header at its start";
      if (!EndsWith(TrimEnd(tail), "%%EOF"))
        return "no %%EOF trailer at its end";
      return "";
  }
  return "unknown picture format";
}

}  // namespace hushgain
