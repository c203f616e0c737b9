// The design note: one stage's budget as a document to file with a design,
// in two forms.
//   html      one self-contained file (no external resource: styles inline,
//             the plot sheet as inline SVG), printable (a print style sheet)
//   markdown  the same text for a repository's design notes, the plot sheet
//             as an SVG file beside it, linked by its relative name
// Sections: the stage and its assumptions (temperature, band, reference, the
// op-amp and where its values come from, with every parameter), the budget
// exactly as `budget --format markdown` writes it (noise table, input-
// referred figures, offsets, the T network against one resistor), the real
// parts (temperature corners, compensation, resistor excess noise) as
// `budget` prints them, the plot sheet, the warnings, and the cautions.
#ifndef HUSHGAIN_REPORT_DESIGN_NOTE_H_
#define HUSHGAIN_REPORT_DESIGN_NOTE_H_

#include <string>

#include "budget/budget.h"
#include "circuit/opamp_model.h"

namespace hushgain {

struct DesignNoteInput {
  const Budget* budget = nullptr;  // the reviewed budget (review/review.h)
  const OpAmpModel* opamp = nullptr;
  // Where the op-amp's values come from: "illustrative class: ..." or
  // "user part: <source>" or "inline parameters in the stage file".
  std::string opamp_data;
  std::string stage_file;  // the stage file's name, as given
  std::string version;     // hushgain's version line
  // html: the plot sheet's SVG document (an XML declaration and DOCTYPE
  // before "<svg" are dropped). markdown: the SVG file's relative name.
  std::string sheet;
};

std::string DesignNoteHtml(const DesignNoteInput& input);
std::string DesignNoteMarkdown(const DesignNoteInput& input);

// The cautions every note ends with.
extern const char* const kDesignNoteCaution;

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_DESIGN_NOTE_H_
