import { CautionNote } from '../../../components/ui/caution-note';

/** Beside every check: isolate first; the manufacturer's procedure and local rules come before this list. */
export function WorkOrderSafetyNote() {
  return (
    <CautionNote>
      Isolate the battery before working on the relay or its circuit, and let the DEF system cool before opening lines. These checks are
      a reminder, not a procedure: the vehicle and engine manufacturers&apos; procedures, your workshop&apos;s rules and local regulations
      prevail. Have a frozen or damaged DEF system handled under the manufacturer&apos;s thaw and inspection procedure.
    </CautionNote>
  );
}
