// The unit symbols every report prints, in UTF-8, written once. --ascii
// spells them in ASCII afterwards (report/ascii_text.h).
#ifndef HUSHGAIN_REPORT_UNIT_SYMBOLS_H_
#define HUSHGAIN_REPORT_UNIT_SYMBOLS_H_

namespace hushgain {

inline constexpr const char* kOhm = "\xCE\xA9";             // "Ω"
inline constexpr const char* kPerRtHz = "/\xE2\x88\x9AHz";  // "/√Hz"

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_UNIT_SYMBOLS_H_
