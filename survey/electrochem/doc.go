// Package electrochem holds the electrochemical side of a corrosion survey as
// pure functions of values: Faraday's law and the constants derived from it,
// mass-loss coupons (ASTM G1 / G31, NACE SP0775 bands), electrical-resistance
// and linear-polarisation probes (Stern–Geary, ASTM G102), reference-electrode
// conversions and cathodic-protection criteria (NACE SP0169, ISO 15589-1),
// sacrificial-anode life (DNV-RP-B401, ISO 15589-2), coating grades and
// dry-film acceptance (ASTM D610, ISO 4628-3, ISO 19840), galvanizing life
// (ISO 9223 / ISO 9224 / ISO 14713-1) and the galvanic series in seawater
// (ASTM G82). It does no I/O and reads no clock.
//
// Each judgement keeps its inputs, its steps with numbers and its source, so
// that a report can show how a result was reached.
package electrochem
