// The look of a toolbar button, shared by the toolbar's pieces: the kit's quiet small button.
import { buttonVariants } from "../../components/ui/button";

export const toolButton = buttonVariants({ variant: "ghost", size: "sm" });
