"""Safety cautions carried by every output. Never behind a flag."""

CAUTIONS = (
    ("Fluid under pressure",
     "Hydraulic fluid under pressure can penetrate the skin and cause serious injury. Never feel for "
     "leaks by hand; seek medical help at once after any injection injury."),
    ("Stored energy",
     "Accumulators, trapped pressure and raised or suspended loads store energy. Lower loads, release "
     "pressure and lock out the machine before any work on the circuit."),
    ("Overrunning and suspended loads",
     "A load that can drive its motor (lowering, downhill travel) must be held and controlled by "
     "load-holding valves and, where people can be beneath or beside it, by a brake that holds on loss "
     "of pressure."),
    ("A design aid",
     "These results are computed from the data entered and are a design aid only. Verify them against "
     "the component makers' data. The design must be reviewed and signed off by a qualified engineer under "
     "the local codes, the standards that apply (for example ISO 4413) and licensed engineering practice."),
)

SHORT = ("Design aid only: verify against makers' data; a qualified engineer must review and sign off. "
         "Pressurised fluid, stored energy and overrunning loads can injure; see the report's cautions.")
