// Whether a picture gnuplot wrote is whole. gnuplot reports no write error:
// on a full disk it leaves a PNG without its end and exits with 0. So a
// picture is checked before it replaces an older file:
//   PNG  the signature 89 50 4E 47 0D 0A 1A 0A first and the IEND chunk
//        00 00 00 00 49 45 4E 44 AE 42 60 82 last (PNG, ISO/IEC 15948,
//        sections 5.2 and 11.2.5: IEND ends the datastream, its length 0
//        and its CRC fixed);
//   SVG  the root's closing tag "</svg>" last, white space after it allowed
//        (SVG 1.1, the root element svg; XML 1.0 allows Misc after it);
//   PDF  "%PDF-" first and "%%EOF" last, an end-of-line after it allowed
//        (ISO 32000-1, sections 7.5.2 and 7.5.5).
#ifndef HUSHGAIN_REPORT_PICTURE_CHECK_H_
#define HUSHGAIN_REPORT_PICTURE_CHECK_H_

#include <string>
#include <string_view>

#include "report/plot_axes.h"

namespace hushgain {

// How many bytes of each end of the file the check needs at most.
inline constexpr std::size_t kPictureHeadBytes = 16;
inline constexpr std::size_t kPictureTailBytes = 1024;

// `head`: the file's first bytes (kPictureHeadBytes, or the whole file when
// shorter); `tail`: its last (kPictureTailBytes, or the whole file).
// Returns "" when the picture is whole, else what is missing, e.g.
// "no IEND chunk at its end", "empty".
std::string IncompletePicture(PlotFormat format, std::string_view head,
                              std::string_view tail);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_PICTURE_CHECK_H_
