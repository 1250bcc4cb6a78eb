export default function Cases() { return null; }
